// A small reproducible generator, so that a draw can be repeated from its key alone.

// FNV-1a, 32-bit: offset basis 2166136261, prime 16777619 (G. Fowler, L. C. Noll, K.-P. Vo,
// D. Eastlake, "The FNV Non-Cryptographic Hash Algorithm", IETF draft-eastlake-fnv, section 2).
const FNV_OFFSET_BASIS = 2166136261
const FNV_PRIME = 16777619

export function hashKey(key: string): number {
  let hash = FNV_OFFSET_BASIS
  for (const byte of new TextEncoder().encode(key)) {
    hash ^= byte
    hash = Math.imul(hash, FNV_PRIME) >>> 0
  }
  return hash
}

/**
 * xorshift32 with the shift triple (13, 17, 5) (G. Marsaglia, "Xorshift RNGs", Journal of
 * Statistical Software 8(14), 2003). Returns numbers in [0, 1).
 */
export function randomFrom(key: string): () => number {
  // The generator is stuck at zero, so a zero hash takes a fixed non-zero state instead.
  let state = hashKey(key) || 0x9E3779B9
  return () => {
    state ^= state << 13
    state >>>= 0
    state ^= state >>> 17
    state ^= state << 5
    state >>>= 0
    return state / 2 ** 32
  }
}

/** A copy of the items in an order fixed by the key (Fisher–Yates; Knuth, TAOCP vol. 2, 3.4.2, Algorithm P). */
export function shuffleWithKey<T>(items: readonly T[], key: string): T[] {
  const out = [...items]
  const next = randomFrom(key)
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(next() * (i + 1))
    const held = out[i]!
    out[i] = out[j]!
    out[j] = held
  }
  return out
}
