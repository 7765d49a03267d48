import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { hashKey, randomFrom, shuffleWithKey } from '../../../shared/tournament'

// Source: IETF draft-eastlake-fnv, "The FNV Non-Cryptographic Hash Algorithm". The check values
// for "", "a" and "foobar" are the widely quoted FNV-1a 32-bit test vectors (MEMORY, confirmed by
// this implementation agreeing with all three).
describe('FNV-1a key hash', () => {
  it('hashes the empty key to the offset basis 0x811c9dc5 (draft-eastlake-fnv)', () => {
    expect(hashKey('')).toBe(0x811C9DC5)
  })

  it('hashes "a" to 0xe40c292c and "foobar" to 0xbf9cf968 (FNV-1a test vectors)', () => {
    expect(hashKey('a')).toBe(0xE40C292C)
    expect(hashKey('foobar')).toBe(0xBF9CF968)
  })
})

describe('reproducible lots', () => {
  it('gives numbers in [0, 1), the same sequence for the same key', () => {
    fc.assert(fc.property(fc.string(), (key) => {
      const a = randomFrom(key)
      const b = randomFrom(key)
      for (let i = 0; i < 20; i++) {
        const x = a()
        expect(x).toBeGreaterThanOrEqual(0)
        expect(x).toBeLessThan(1)
        expect(b()).toBe(x)
      }
    }))
  })

  it('shuffles into a permutation of the items, the same for the same key, leaving the input alone', () => {
    fc.assert(fc.property(fc.array(fc.integer()), fc.string(), (items, key) => {
      const copy = [...items]
      const shuffled = shuffleWithKey(items, key)
      expect(items).toEqual(copy)
      expect([...shuffled].sort((a, b) => a - b)).toEqual([...items].sort((a, b) => a - b))
      expect(shuffleWithKey(items, key)).toEqual(shuffled)
    }))
  })

  it('spreads the first place of a shuffle of four over all four items', () => {
    const firsts = new Map<number, number>()
    for (let i = 0; i < 400; i++) {
      const first = shuffleWithKey([1, 2, 3, 4], `Harvest Open ${i}`)[0]!
      firsts.set(first, (firsts.get(first) ?? 0) + 1)
    }
    // 100 expected each; a generous band that only a broken shuffle would leave.
    for (const item of [1, 2, 3, 4]) expect(firsts.get(item)).toBeGreaterThan(60)
  })
})
