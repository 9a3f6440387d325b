/**
 * Dependency order of a note's blocks: Kahn's algorithm, ties kept in document
 * order so that the order is the same on every run; a cycle is reported as the
 * path that closes it.
 */

/** Blocks in evaluation order, and any cycles found (each as a closed path of ids). */
export function dependencyOrder(ids: readonly string[], needs: ReadonlyMap<string, ReadonlySet<string>>): { order: string[]; cycles: string[][] } {
  const remaining = new Map(ids.map((id) => [id, new Set([...(needs.get(id) ?? [])].filter((n) => ids.includes(n)))]))
  const order: string[] = []
  let progress = true
  while (progress) {
    progress = false
    for (const id of ids) {
      const wants = remaining.get(id)
      if (!wants || wants.size > 0) continue
      remaining.delete(id)
      order.push(id)
      for (const other of remaining.values()) other.delete(id)
      progress = true
      break
    }
  }
  const cycles: string[][] = []
  const inCycle = new Set<string>()
  for (const start of ids) {
    if (!remaining.has(start) || inCycle.has(start)) continue
    // Walk from a stuck block along unmet needs until a block repeats.
    const path: string[] = [start]
    let current = start
    for (;;) {
      const next = [...remaining.get(current)!][0]!
      const seen = path.indexOf(next)
      if (seen >= 0) {
        const cycle = [...path.slice(seen), next]
        if (!cycle.some((id) => inCycle.has(id))) {
          cycles.push(cycle)
          for (const id of cycle) inCycle.add(id)
        }
        break
      }
      path.push(next)
      current = next
    }
  }
  return { order, cycles }
}
