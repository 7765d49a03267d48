import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { randomFrom, shuffleWithKey } from '../../../shared/tournament'

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
