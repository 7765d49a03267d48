// The drawn lot: a small, well-known hash (32-bit FNV-1a, Fowler–Noll–Vo) seeds a small,
// well-known generator (mulberry32). Both are chosen because they are a few lines each, give the
// same numbers in every JavaScript engine, and so let anyone re-draw a stored lot.

const FNV_OFFSET = 0x811C9DC5
const FNV_PRIME = 0x01000193

/** 32-bit FNV-1a over the UTF-8 bytes of the text. */
export function hashString(text: string): number {
  let hash = FNV_OFFSET
  for (const byte of new TextEncoder().encode(text)) {
    hash ^= byte
    hash = Math.imul(hash, FNV_PRIME)
  }
  return hash >>> 0
}

/** mulberry32: a generator of numbers in [0, 1) from a 32-bit seed. */
export function mulberry32(seed: number): () => number {
  let state = seed >>> 0
  return () => {
    state = (state + 0x6D2B79F5) >>> 0
    let t = state
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

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
  const next = mulberry32(hashString([seed, ...sorted].join('\u0000')))
  const order = [...sorted]
  for (let i = order.length - 1; i > 0; i--) {
    const j = Math.floor(next() * (i + 1))
    const held = order[i]!
    order[i] = order[j]!
    order[j] = held
  }
  return { fighterIds: sorted, order }
}
