// Chart colours come from the same semantic tokens as the rest of the app (tailwind.config.ts), so
// a chart says "hot", "cool" or "muted", never a hue of its own.
import config from '../../tailwind.config'

const colors = config.theme.extend.colors

/** `#rrggbb` → `rgba(r, g, b, alpha)`. */
export function withAlpha(hex: string, alpha: number): string {
  const n = Number.parseInt(hex.slice(1), 16)
  return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`
}

export const CHART_PALETTE = {
  charge: colors.hot.DEFAULT,
  preCooler: colors.warn.DEFAULT,
  ambient: colors.cool.DEFAULT,
  pressure: colors.accent.DEFAULT,
  rpm: colors.muted.DEFAULT,
  pullShade: withAlpha(colors.accent.DEFAULT, 0.12),
  maskShade: withAlpha(colors.danger.DEFAULT, 0.12),
  mask: colors.danger.DEFAULT,
  soakShade: withAlpha(colors.warn.DEFAULT, 0.18),
  soak: colors.warn.DEFAULT,
  good: colors.good.DEFAULT,
  ink: colors.ink.DEFAULT,
  inkSoft: colors.ink.soft,
  line: colors.muted.line,
  muted: colors.muted.DEFAULT,
} as const

export const CHART_FONT = '"Roboto Flex", system-ui, sans-serif'
