/**
 * The assignment of rows to columns with the least total cost, for a square matrix (the
 * Hungarian method: H. W. Kuhn, Naval Research Logistics Quarterly 2, 1955, in the O(n³) form
 * with potentials). Returns the column chosen for each row.
 */
export function assign(cost: readonly (readonly number[])[]): number[] {
  const n = cost.length
  const u = Array.from({ length: n + 1 }, () => 0)
  const v = Array.from({ length: n + 1 }, () => 0)
  const rowOf = Array.from({ length: n + 1 }, () => 0)
  const way = Array.from({ length: n + 1 }, () => 0)
  for (let i = 1; i <= n; i++) {
    rowOf[0] = i
    let j0 = 0
    const minv = Array.from({ length: n + 1 }, () => Infinity)
    const used = Array.from({ length: n + 1 }, () => false)
    do {
      used[j0] = true
      const i0 = rowOf[j0]!
      let delta = Infinity
      let j1 = 0
      for (let j = 1; j <= n; j++) {
        if (used[j]) continue
        const reduced = cost[i0 - 1]![j - 1]! - u[i0]! - v[j]!
        if (reduced < minv[j]!) {
          minv[j] = reduced
          way[j] = j0
        }
        if (minv[j]! < delta) {
          delta = minv[j]!
          j1 = j
        }
      }
      for (let j = 0; j <= n; j++) {
        if (used[j]) {
          u[rowOf[j]!] = u[rowOf[j]!]! + delta
          v[j] = v[j]! - delta
        }
        else {
          minv[j] = minv[j]! - delta
        }
      }
      j0 = j1
    } while (rowOf[j0] !== 0)
    do {
      const j1 = way[j0]!
      rowOf[j0] = rowOf[j1]!
      j0 = j1
    } while (j0 !== 0)
  }
  const columnOf = Array.from({ length: n }, () => 0)
  for (let j = 1; j <= n; j++) {
    if (rowOf[j]! > 0) columnOf[rowOf[j]! - 1] = j - 1
  }
  return columnOf
}
