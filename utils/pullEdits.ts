// A tuner's pull corrections are stored as edits against the engine's automatic pulls (remove and
// adjust name the automatic index). The report lists the pulls after edits, so removing one from
// the table needs its automatic index back: rebuilt here from what the analysis tells us.
import type { CodedMessage, PullEdits, PullResult } from '#shared/types/report'

const NEAR_S = 0.6

function maskedPullStarts(warnings: readonly CodedMessage[]): number[] {
  const starts: number[] = []
  for (const w of warnings) {
    if (w.code !== 'PULL_MASKED') continue
    const match = /at (\d+(?:\.\d+)?)[–-]/.exec(w.message)
    if (match) starts.push(Number(match[1]))
  }
  return starts
}

export function editsAddingPull(edits: PullEdits | null | undefined, window: { startS: number, endS: number }): PullEdits {
  const startS = Math.round(Math.min(window.startS, window.endS) * 10) / 10
  const endS = Math.round(Math.max(window.startS, window.endS) * 10) / 10
  return { ...edits, add: [...(edits?.add ?? []), { startS, endS }] }
}

/** The edits with `target` gone: an added pull is dropped from `add`, an automatic one joins `remove`. */
export function editsRemovingPull(edits: PullEdits | null | undefined, pulls: readonly PullResult[], warnings: readonly CodedMessage[], target: PullResult): PullEdits {
  const add = [...(edits?.add ?? [])]
  const remove = [...(edits?.remove ?? [])]
  const adjust = [...(edits?.adjust ?? [])]
  const next = (): PullEdits => ({ ...(add.length ? { add } : {}), ...(remove.length ? { remove } : {}), ...(adjust.length ? { adjust } : {}) })

  if (target.origin === 'added') {
    let best = -1
    let bestGap = Number.POSITIVE_INFINITY
    add.forEach((a, i) => {
      const gap = Math.abs(a.startS - target.startS) + Math.abs(a.endS - target.endS)
      if (gap < bestGap) {
        best = i
        bestGap = gap
      }
    })
    if (best >= 0) add.splice(best, 1)
    return next()
  }
  if (target.origin === 'adjusted') {
    const at = adjust.findIndex(a => Math.abs((a.startS ?? target.startS) - target.startS) < NEAR_S && Math.abs((a.endS ?? target.endS) - target.endS) < NEAR_S)
    if (at >= 0) {
      remove.push(adjust[at]!.index)
      adjust.splice(at, 1)
    }
    return next()
  }
  // Automatic pulls, in time order, are the visible ones plus those the masks dropped (the
  // analysis names those in a warning); removed and adjusted ones hold their own indexes.
  const masked = maskedPullStarts(warnings).filter(s => !add.some(a => Math.abs(a.startS - s) < NEAR_S))
  const autoStarts = [...pulls.filter(p => p.origin === 'auto').map(p => p.startS), ...masked].sort((a, b) => a - b)
  const held = new Set([...remove, ...adjust.map(a => a.index)])
  const free: number[] = []
  for (let i = 0; free.length < autoStarts.length; i++) if (!held.has(i)) free.push(i)
  const position = autoStarts.findIndex(s => Math.abs(s - target.startS) < 1e-6)
  if (position >= 0) remove.push(free[position]!)
  remove.sort((a, b) => a - b)
  return next()
}
