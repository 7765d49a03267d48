/** A fighter entered in a tournament, as the pools need to see them. */
export interface Entry {
  id: number
  /** 1 is the best; null for an unseeded entry. */
  seed: number | null
  clubId: number | null
}

/** Two 1-based positions within a pool; the first listed takes the first side. */
export type Pair = readonly [number, number]

/** A match between two fighters, by id, in the same side order as its pair. */
export type Pairing = readonly [number, number]
