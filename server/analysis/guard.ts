// Impossible input to a physics function is an error with a plain message, never a NaN that
// travels on into a report (issue 10). Routes turn it into a 422 like every LogImportError.
import { LogImportError } from './import/errors'

export function impossible(message: string): never {
  throw new LogImportError('IMPOSSIBLE_INPUT', message)
}

/** A finite number above zero (an absolute temperature, a pressure, a mass flow). */
export function requirePositive(what: string, value: number, unit: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || !(value > 0)) impossible(`${what} must be a positive number${unit ? ` in ${unit}` : ''}; got ${String(value)}.`)
}

/** A finite number in [min, max] (or (min, max) when open). */
export function requireBetween(what: string, value: number, min: number, max: number, open = false): void {
  const ok = typeof value === 'number' && Number.isFinite(value) && (open ? value > min && value < max : value >= min && value <= max)
  if (!ok) impossible(`${what} must be ${open ? 'strictly ' : ''}between ${min} and ${max}; got ${String(value)}.`)
}
