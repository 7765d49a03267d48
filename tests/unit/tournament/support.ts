import type { Entry, Pair } from '../../../shared/tournament'

/** The invented clubs of the demo scenario (DOMAIN.md), by the ids the tests give them. */
export const CLUBS = {
  saltmarsh: 1, // Saltmarsh Sword Guild, the host
  ironquay: 2, // Ironquay Fencing Hall
  northDowns: 3, // North Downs Buckler Circle
  lanterngate: 4, // Lanterngate Historical Fencing
  greyfield: 5, // Greyfield Sword Society
  oldMill: 6, // Old Mill Fencing School
} as const

export const pairKey = ([a, b]: readonly [number, number]) => (a < b ? `${a}-${b}` : `${b}-${a}`)

/** True when the order meets every pair of positions 1..size exactly once. */
export function coversEveryPairOnce(order: readonly Pair[], size: number): boolean {
  const keys = order.map(pairKey)
  if (new Set(keys).size !== keys.length) return false
  if (keys.length !== size * (size - 1) / 2) return false
  return order.every(([a, b]) => a !== b && a >= 1 && b >= 1 && a <= size && b <= size)
}

/** How many times each position takes the first side. */
export function firstSides(order: readonly Pair[], size: number): number[] {
  const counts = Array.from({ length: size }, () => 0)
  for (const [a] of order) counts[a - 1]!++
  return counts
}

export const entry = (id: number, seed: number | null, clubId: number | null = null): Entry => ({ id, seed, clubId })

/** Every ordering of the items (for exhaustive checks on small inputs). */
export function permutations<T>(items: readonly T[]): T[][] {
  if (items.length <= 1) return [[...items]]
  return items.flatMap((item, i) => permutations([...items.slice(0, i), ...items.slice(i + 1)]).map(rest => [item, ...rest]))
}
