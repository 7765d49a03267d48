// Reproducible randomness for draws and lots: the same key gives the same numbers in every
// JavaScript engine, so anyone can re-draw a stored pool draw or lot from its key.

// 32-bit FNV-1a: offset basis 0x811C9DC5, prime 0x01000193 (G. Fowler, L. C. Noll, K.-P. Vo,
// D. Eastlake, "The FNV Non-Cryptographic Hash Algorithm", IETF draft-eastlake-fnv, section 2).
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

/** mulberry32: a small, well-known generator of numbers in [0, 1) from a 32-bit seed. */
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

/** A generator fixed by a text key. */
export function randomFromKey(key: string): () => number {
  return mulberry32(hashString(key))
}

/** A shuffled copy (Fisher–Yates; Knuth, TAOCP vol. 2, 3.4.2, Algorithm P). */
export function seededShuffle<T>(items: readonly T[], next: () => number): T[] {
  const out = [...items]
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(next() * (i + 1))
    const held = out[i]!
    out[i] = out[j]!
    out[j] = held
  }
  return out
}
