// A tuner's pull corrections are stored as edits against the engine's automatic pulls: remove and
// adjust name the automatic index, which every analysed pull carries as `autoIndex`.
import type { PullEdits, PullResult } from '#shared/types/report'

export function editsAddingPull(edits: PullEdits | null | undefined, window: { startS: number, endS: number }): PullEdits {
  const startS = Math.round(Math.min(window.startS, window.endS) * 10) / 10
  const endS = Math.round(Math.max(window.startS, window.endS) * 10) / 10
  return { ...edits, add: [...(edits?.add ?? []), { startS, endS }] }
}

/** The edits with `target` gone: an added pull leaves `add`; an automatic or adjusted one joins `remove`. */
export function editsRemovingPull(edits: PullEdits | null | undefined, target: PullResult): PullEdits {
  const add = [...(edits?.add ?? [])]
  const remove = [...(edits?.remove ?? [])]
  let adjust = [...(edits?.adjust ?? [])]

  if (target.autoIndex === null) {
    // Added pulls are stored by time: drop the addition closest to this pull.
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
  }
  else {
    adjust = adjust.filter(a => a.index !== target.autoIndex)
    if (!remove.includes(target.autoIndex)) remove.push(target.autoIndex)
    remove.sort((a, b) => a - b)
  }
  return { ...(add.length ? { add } : {}), ...(remove.length ? { remove } : {}), ...(adjust.length ? { adjust } : {}) }
}
