import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  MAX_POOL_SIZE,
  POOL_ORDER_TABLES,
  generateOrder,
  poolOrder,
  restStats,
  toPairings,
} from '../../../shared/tournament'
import type { Pair } from '../../../shared/tournament'
import { coversEveryPairOnce, firstSides, pairKey, permutations } from './support'

const allPairs = (n: number): Pair[] => {
  const out: Pair[] = []
  for (let a = 1; a <= n; a++) {
    for (let b = a + 1; b <= n; b++) out.push([a, b])
  }
  return out
}

// The tables for 4, 5 and 6 are the FIE's order tables as remembered in DOMAIN.md (MEMORY: the
// article was not verified), so these tests check only their properties, not the exact order.
describe('pool order tables remembered from the FIE (properties only)', () => {
  for (const size of [4, 5, 6] as const) {
    it(`meets every pair once in a pool of ${size}`, () => {
      expect(coversEveryPairOnce(POOL_ORDER_TABLES[size], size)).toBe(true)
    })
  }

  it('has nobody fence twice in a row in pools of 5 and 6', () => {
    expect(restStats(POOL_ORDER_TABLES[5]).backToBack).toBe(0)
    expect(restStats(POOL_ORDER_TABLES[6]).backToBack).toBe(0)
  })

  it('has two back-to-back matches in a pool of 4, the fewest any order of 4 can have', () => {
    expect(restStats(POOL_ORDER_TABLES[4]).backToBack).toBe(2)
    const fewest = Math.min(...permutations(allPairs(4)).map(order => restStats(order).backToBack))
    expect(fewest).toBe(2)
  })
})

// Our own tables for 7 and 8, built by search for this project (no published source).
describe('pool order tables for 7 and 8 (our own)', () => {
  for (const size of [7, 8] as const) {
    it(`meets every pair once, with at least two matches of rest, in a pool of ${size}`, () => {
      const table = POOL_ORDER_TABLES[size]
      expect(coversEveryPairOnce(table, size)).toBe(true)
      expect(restStats(table).minRest).toBe(2)
    })

    it(`gives each fighter in a pool of ${size} the first side as often as the second, give or take one`, () => {
      const firsts = firstSides(POOL_ORDER_TABLES[size], size)
      for (const count of firsts) expect(Math.abs(count - (size - 1 - count))).toBeLessThanOrEqual(1)
    })
  }

  it('keeps the longest rest in a pool of 7 to three matches and in a pool of 8 to four', () => {
    expect(restStats(POOL_ORDER_TABLES[7]).maxRest).toBe(3)
    expect(restStats(POOL_ORDER_TABLES[8]).maxRest).toBe(4)
  })
})

describe('generated pool orders', () => {
  it('meets every pair exactly once for every size from 2 to the largest', () => {
    for (let size = 2; size <= MAX_POOL_SIZE; size++) {
      expect(coversEveryPairOnce(generateOrder(size), size)).toBe(true)
    }
  })

  it('has nobody fence twice in a row for pools of 5 and more', () => {
    for (let size = 5; size <= MAX_POOL_SIZE; size++) {
      expect(restStats(generateOrder(size)).backToBack).toBe(0)
    }
  })

  it('reaches the most rest possible for pools of 5 to 12', () => {
    // Odd n: (n - 3) / 2 matches; even n: n / 2 - 2 (see restBound in order.ts for the reason).
    const bound = (n: number) => (n % 2 === 1 ? (n - 3) / 2 : n / 2 - 2)
    for (let size = 5; size <= 12; size++) {
      expect(restStats(generateOrder(size)).minRest).toBe(bound(size))
    }
  })

  it('cannot avoid a back-to-back match in a pool of 3: every order of its three matches has one', () => {
    expect(restStats(generateOrder(3)).backToBack).toBe(2)
    for (const order of permutations(allPairs(3))) {
      expect(restStats(order).backToBack).toBeGreaterThan(0)
    }
  })

  it('gives everyone in a pool of nine fighters 8 opponents (common practice, no source)', () => {
    const order = poolOrder(9)
    for (let position = 1; position <= 9; position++) {
      const opponents = order.filter(pair => pair.includes(position)).map(([a, b]) => (a === position ? b : a))
      expect(new Set(opponents).size).toBe(8)
    }
  })

  it('gives the same order every time', () => {
    fc.assert(fc.property(fc.integer({ min: 2, max: 12 }), (size) => {
      expect(generateOrder(size)).toEqual(generateOrder(size))
    }), { numRuns: 20 })
  })

  it('balances sides to within one match for every fighter', () => {
    for (let size = 2; size <= MAX_POOL_SIZE; size++) {
      const firsts = firstSides(generateOrder(size), size)
      expect(Math.max(...firsts) - Math.min(...firsts)).toBeLessThanOrEqual(1)
    }
  })

  it('refuses pools of fewer than 2 or more than the largest size', () => {
    expect(() => generateOrder(1)).toThrow(/2 to 20/)
    expect(() => generateOrder(MAX_POOL_SIZE + 1)).toThrow(/2 to 20/)
    expect(() => poolOrder(3.5)).toThrow(/2 to 20/)
  })
})

describe('poolOrder', () => {
  it('uses the tables for pools of 4 to 8 and the generator otherwise', () => {
    for (const size of [4, 5, 6, 7, 8] as const) expect(poolOrder(size)).toEqual(POOL_ORDER_TABLES[size])
    expect(poolOrder(9)).toEqual(generateOrder(9))
    expect(poolOrder(3)).toEqual(generateOrder(3))
  })

  it('returns a copy the caller may change without touching the table', () => {
    const order = poolOrder(5)
    order.reverse()
    expect(poolOrder(5)[0]).toEqual([1, 2])
  })
})

describe('restStats', () => {
  it('counts matches sat out between a fighter\'s own matches', () => {
    // 1 rests one match (0 → 2), 3 none (1 → 2).
    expect(restStats([[1, 2], [3, 4], [1, 3]])).toEqual({ minRest: 0, meanRest: 0.5, maxRest: 1, backToBack: 1 })
  })

  it('has no rest to report when nobody fences twice', () => {
    expect(restStats([[1, 2]])).toEqual({ minRest: null, meanRest: null, maxRest: null, backToBack: 0 })
  })
})

describe('toPairings', () => {
  it('puts fighter ids in place of positions, sides kept', () => {
    expect(toPairings([[1, 4], [2, 3], [3, 1]], [41, 42, 43, 44])).toEqual([[41, 44], [42, 43], [43, 41]])
  })

  it('keeps every pair of fighters exactly once for a whole pool', () => {
    const ids = [207, 112, 350, 98, 61]
    const pairings = toPairings(poolOrder(5), ids)
    expect(new Set(pairings.map(pairKey)).size).toBe(10)
  })

  it('refuses a list of fighters that does not fit the order', () => {
    expect(() => toPairings(poolOrder(4), [1, 2, 3])).toThrow(/for 4 fighters but 3/)
    expect(() => toPairings(poolOrder(3), [1, 1, 2])).toThrow(/twice/)
  })
})
