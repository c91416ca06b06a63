// Node 20 has no Object.groupBy (it arrived in Node 21); the lint toolchain uses it.
if (typeof Object.groupBy !== 'function') {
  Object.groupBy = function groupBy(items, keyOf) {
    const groups = Object.create(null)
    let index = 0
    for (const item of items) {
      const key = keyOf(item, index++)
      ;(groups[key] ??= []).push(item)
    }
    return groups
  }
}
