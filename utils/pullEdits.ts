// A tuner's pull corrections are stored as edits against the engine's automatic pulls: remove and
// adjust name the automatic index, which every analysed pull carries as `autoIndex`.
import type { ManualPullRule, PullEdits, PullResult } from '#shared/types/report'

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
  return { ...keptSettings(edits), ...(add.length ? { add } : {}), ...(remove.length ? { remove } : {}), ...(adjust.length ? { adjust } : {}) }
}

/** The rule set by hand and the keep-left-out choice, which every edit carries along. */
function keptSettings(edits: PullEdits | null | undefined): Pick<PullEdits, 'rule' | 'keepLeftOut'> {
  return { ...(edits?.rule ? { rule: edits.rule } : {}), ...(edits?.keepLeftOut ? { keepLeftOut: true } : {}) }
}

/**
 * The edits with a full-load rule set by hand (or, with null, the automatic rule back). A new rule
 * finds different pulls, so removals and adjustments (which name the automatic pulls by number)
 * are dropped; pulls added by hand stay.
 */
export function editsWithRule(edits: PullEdits | null | undefined, rule: ManualPullRule | null): PullEdits {
  return { ...(edits?.add?.length ? { add: edits.add } : {}), ...(rule ? { rule } : {}), ...(edits?.keepLeftOut ? { keepLeftOut: true } : {}) }
}

/** The edits with the pulls left out for a sensor fault kept (or left out again). */
export function editsKeepingLeftOut(edits: PullEdits | null | undefined, keep: boolean): PullEdits {
  const { keepLeftOut: _drop, ...rest } = edits ?? {}
  return keep ? { ...rest, keepLeftOut: true } : rest
}
