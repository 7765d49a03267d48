import { describe, expect, it } from 'vitest'
import { hashString, mulberry32, randomFromKey, seededShuffle } from '../../shared/utils/random'

// Source: IETF draft-eastlake-fnv, "The FNV Non-Cryptographic Hash Algorithm". The check values
// for "", "a" and "foobar" are the widely quoted FNV-1a 32-bit test vectors (MEMORY, confirmed by
// this implementation agreeing with all three).
describe('FNV-1a', () => {
  it('hashes the empty text to the offset basis 0x811c9dc5 (draft-eastlake-fnv)', () => {
    expect(hashString('')).toBe(0x811C9DC5)
  })

  it('hashes "a" to 0xe40c292c and "foobar" to 0xbf9cf968 (FNV-1a test vectors)', () => {
    expect(hashString('a')).toBe(0xE40C292C)
    expect(hashString('foobar')).toBe(0xBF9CF968)
  })
})

describe('mulberry32', () => {
  it('generates the same numbers in [0, 1) from the same seed, others from another', () => {
    const a = Array.from({ length: 1000 }, mulberry32(42))
    expect(Array.from({ length: 1000 }, mulberry32(42))).toEqual(a)
    expect(a.every(x => x >= 0 && x < 1)).toBe(true)
    expect(Array.from({ length: 5 }, mulberry32(43))).not.toEqual(a.slice(0, 5))
  })

  it('averages 0.5 over 10 000 draws, within five standard errors (0.0029 each)', () => {
    const next = randomFromKey('Wrenmouth Harvest Open')
    const mean = Array.from({ length: 10_000 }, () => next()).reduce((s, x) => s + x, 0) / 10_000
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.015)
  })
})

describe('seeded shuffle', () => {
  it('is a permutation and leaves its input alone', () => {
    const items = [1, 2, 3, 4, 5, 6, 7, 8]
    const out = seededShuffle(items, mulberry32(1))
    expect([...out].sort((x, y) => x - y)).toEqual(items)
    expect(items).toEqual([1, 2, 3, 4, 5, 6, 7, 8])
  })
})
