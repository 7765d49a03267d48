// The drawn lot uses the project's one reproducible generator (shared/utils/random.ts).
import { hashString, mulberry32, seededShuffle } from '../utils/random'

export { hashString, mulberry32 }

export interface LotDraw {
  /** The fighters the lot separated, sorted by id. */
  fighterIds: string[]
  /** The order the lot gave them, best first. */
  order: string[]
}

/**
 * Draws an order for fighters who are level on everything else. The seed string and the sorted
 * ids decide the draw, so the same fighters and seed always give the same order, whatever order
 * they are passed in.
 */
export function drawLot(seed: string, fighterIds: readonly string[]): LotDraw {
  const sorted = [...new Set(fighterIds)].sort()
  const order = seededShuffle(sorted, mulberry32(hashString([seed, ...sorted].join('\u0000'))))
  return { fighterIds: sorted, order }
}
