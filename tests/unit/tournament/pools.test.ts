import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { drawOrder, drawPools, planPools, serpentinePool, validateMove } from '../../../shared/tournament'
import type { Entry } from '../../../shared/tournament'
import { assign } from '../../../shared/tournament/assignment'
import { CLUBS, entry, permutations } from './support'

const seedsOf = (pools: readonly (readonly Entry[])[]) => pools.map(pool => pool.map(e => e.seed))
const idsOf = (pools: readonly (readonly Entry[])[]) => pools.map(pool => pool.map(e => e.id))

function clashPairs(pools: readonly (readonly Entry[])[]): number {
  let pairs = 0
  for (const pool of pools) {
    const counts = new Map<number, number>()
    for (const e of pool) if (e.clubId !== null) counts.set(e.clubId, (counts.get(e.clubId) ?? 0) + 1)
    for (const n of counts.values()) pairs += n * (n - 1) / 2
  }
  return pairs
}

/** Entries with distinct ids, some seeded (distinct seeds, in any order), clubs from the demo or none. */
const entriesArb = (min: number, max: number) => fc
  .uniqueArray(fc.integer({ min: 1, max: 10_000 }), { minLength: min, maxLength: max })
  .chain(ids => fc.tuple(
    fc.constant(ids),
    fc.shuffledSubarray(Array.from({ length: ids.length }, (_, i) => i + 1)),
    fc.array(fc.option(fc.integer({ min: 1, max: 6 }), { nil: null }), { minLength: ids.length, maxLength: ids.length }),
  ))
  .map(([ids, seeds, clubs]) => ids.map((id, i) => entry(id, seeds[i] ?? null, clubs[i] ?? null)))

const drawArb = entriesArb(2, 60).chain(entries => fc.tuple(
  fc.constant(entries),
  fc.integer({ min: 1, max: Math.floor(entries.length / 2) }),
  fc.string({ maxLength: 12 }),
))

describe('planPools', () => {
  it('splits 30 entries with a target of 7 into pools of 8, 8, 7 and 7', () => {
    expect(planPools(30, 7)).toEqual({ poolCount: 4, sizes: [8, 8, 7, 7] })
  })

  it('adds pools when a largest size is set', () => {
    expect(planPools(30, 7, { maxSize: 7 })).toEqual({ poolCount: 5, sizes: [6, 6, 6, 6, 6] })
  })

  it('keeps a small field in one pool', () => {
    expect(planPools(5, 6)).toEqual({ poolCount: 1, sizes: [5] })
  })

  it('never makes a pool smaller than the minimum', () => {
    expect(planPools(9, 2)).toEqual({ poolCount: 4, sizes: [3, 2, 2, 2] })
    expect(planPools(7, 3, { minSize: 3 })).toEqual({ poolCount: 2, sizes: [4, 3] })
  })

  it('refuses what cannot be done, saying why', () => {
    expect(() => planPools(1, 5)).toThrow(/1 entry is too few for a pool of at least 2/)
    expect(() => planPools(10, 1)).toThrow(/below the smallest allowed pool of 2/)
    expect(() => planPools(5, 3, { minSize: 3, maxSize: 3 })).toThrow(/cannot be split into pools of 3 to 3/)
    expect(() => planPools(10.5, 5)).toThrow(/whole number/)
    expect(() => planPools(10, 5, { minSize: 1 })).toThrow(/whole number of at least 2/)
  })

  it('gives sizes that add up and differ by at most one, never below the minimum', () => {
    fc.assert(fc.property(fc.integer({ min: 2, max: 200 }), fc.integer({ min: 2, max: 12 }), (count, target) => {
      const plan = planPools(count, target)
      expect(plan.sizes).toHaveLength(plan.poolCount)
      expect(plan.sizes.reduce((a, b) => a + b, 0)).toBe(count)
      expect(Math.max(...plan.sizes) - Math.min(...plan.sizes)).toBeLessThanOrEqual(1)
      expect(Math.min(...plan.sizes)).toBeGreaterThanOrEqual(2)
    }))
  })
})

describe('drawPools: serpentine seeding', () => {
  it('deals seeds 1, 2, 3 to pools 1, 2, 3 and seeds 4, 5, 6 back to pools 3, 2, 1', () => {
    const entries = [1, 2, 3, 4, 5, 6].map(seed => entry(100 + seed, seed))
    expect(seedsOf(drawPools(entries, 3).pools)).toEqual([[1, 6], [2, 5], [3, 4]])
  })

  it('turns again on the third row', () => {
    const entries = [1, 2, 3, 4, 5, 6, 7, 8, 9].map(seed => entry(100 + seed, seed))
    expect(seedsOf(drawPools(entries, 3).pools)).toEqual([[1, 6, 7], [2, 5, 8], [3, 4, 9]])
  })

  it('ranks by seed whatever the numbers, and puts the unseeded after the seeded', () => {
    const entries = [entry(1, null), entry(2, 40), entry(3, 7), entry(4, null), entry(5, 12), entry(6, 3)]
    const order = drawOrder(entries, 'key')
    expect(order.slice(0, 4).map(e => e.seed)).toEqual([3, 7, 12, 40])
    expect(order.slice(4).map(e => e.id).sort()).toEqual([1, 4])
  })

  it('refuses duplicate ids, duplicate seeds, seeds below 1 and too few entries for the pools', () => {
    expect(() => drawPools([entry(1, 1), entry(1, 2)], 1)).toThrow(/Fighter 1 is entered twice/)
    expect(() => drawPools([entry(1, 1), entry(2, 1)], 1)).toThrow(/Seed 1 is given to two fighters/)
    expect(() => drawPools([entry(1, 0), entry(2, 1)], 1)).toThrow(/seeds are whole numbers from 1/)
    expect(() => drawPools([entry(1, 1), entry(2, 2), entry(3, 3)], 2)).toThrow(/3 entries cannot fill 2 pools of at least 2/)
  })

  it('puts every entry in exactly one pool, sizes differing by at most one', () => {
    fc.assert(fc.property(drawArb, ([entries, poolCount, drawKey]) => {
      const { pools } = drawPools(entries, poolCount, { drawKey })
      expect(pools).toHaveLength(poolCount)
      expect(pools.flat().map(e => e.id).sort((a, b) => a - b)).toEqual(entries.map(e => e.id).sort((a, b) => a - b))
      const sizes = pools.map(p => p.length)
      expect(Math.max(...sizes) - Math.min(...sizes)).toBeLessThanOrEqual(1)
      expect(Math.min(...sizes)).toBeGreaterThanOrEqual(2)
    }))
  })

  it('follows the serpentine exactly when no two fighters share a club', () => {
    fc.assert(fc.property(drawArb, ([entries, poolCount, drawKey]) => {
      const own = entries.map((e, i) => ({ ...e, clubId: i % 3 === 0 ? null : 1000 + i }))
      const draw = drawPools(own, poolCount, { drawKey })
      expect(draw.moves).toEqual([])
      expect(draw.notes).toEqual([])
      drawOrder(own, drawKey).forEach((e, k) => {
        expect(draw.pools[serpentinePool(k, poolCount)]).toContainEqual(e)
      })
    }))
  })

  it('gives the same pools for the same entries and key, in whatever order they arrive', () => {
    fc.assert(fc.property(drawArb, fc.integer(), ([entries, poolCount, drawKey], shuffleSeed) => {
      const reversed = [...entries].reverse()
      const rotated = entries.map((_, i) => entries[(i + Math.abs(shuffleSeed)) % entries.length]!)
      const first = drawPools(entries, poolCount, { drawKey })
      expect(drawPools(entries, poolCount, { drawKey })).toEqual(first)
      expect(drawPools(reversed, poolCount, { drawKey })).toEqual(first)
      expect(drawPools(rotated, poolCount, { drawKey })).toEqual(first)
    }))
  })

  it('lets the key change the order of the unseeded', () => {
    const entries = Array.from({ length: 12 }, (_, i) => entry(i + 1, null))
    const layouts = new Set(['Wrenmouth 1', 'Wrenmouth 2', 'Wrenmouth 3', 'Wrenmouth 4'].map(key => JSON.stringify(idsOf(drawPools(entries, 3, { drawKey: key }).pools))))
    expect(layouts.size).toBeGreaterThan(1)
  })
})

describe('drawPools: club separation', () => {
  it('parts two fighters of one club by exchanging the lower one with the next seed in its row', () => {
    // Plain serpentine: pool 1 = seeds 1 and 6, both Ironquay.
    const entries = [
      entry(11, 1, CLUBS.ironquay),
      entry(12, 2, CLUBS.saltmarsh),
      entry(13, 3, CLUBS.greyfield),
      entry(14, 4, CLUBS.oldMill),
      entry(15, 5, CLUBS.lanterngate),
      entry(16, 6, CLUBS.ironquay),
    ]
    const draw = drawPools(entries, 3)
    expect(seedsOf(draw.pools)).toEqual([[1, 5], [2, 6], [3, 4]])
    expect(draw.moves).toEqual([{ fighterId: 15, from: 1, to: 0 }, { fighterId: 16, from: 0, to: 1 }])
    expect(draw.notes).toEqual([])
  })

  it('keeps the plain serpentine when asked not to separate, and still notes the clash', () => {
    // Serpentine over 2 pools: seeds 1 and 4 share pool 1, both Ironquay.
    const entries = [entry(11, 1, CLUBS.ironquay), entry(12, 2), entry(13, 3), entry(14, 4, CLUBS.ironquay)]
    const draw = drawPools(entries, 2, { separateClubs: false })
    expect(seedsOf(draw.pools)).toEqual([[1, 4], [2, 3]])
    expect(draw.moves).toEqual([])
    expect(draw.notes.map(n => [n.kind, n.pool, n.clubId, n.fighterIds])).toEqual([['separation-off', 0, CLUBS.ironquay, [11, 14]]])
    expect(seedsOf(drawPools(entries, 2).pools)).toEqual([[1, 3], [2, 4]])
  })

  it('notes a club with more fighters than pools, pool by pool', () => {
    const clubs = [CLUBS.saltmarsh, CLUBS.saltmarsh, CLUBS.saltmarsh, CLUBS.saltmarsh, CLUBS.greyfield, CLUBS.oldMill]
    const entries = clubs.map((club, i) => entry(i + 1, i + 1, club))
    const draw = drawPools(entries, 3)
    expect(draw.notes).toHaveLength(1)
    const [note] = draw.notes
    expect(note).toMatchObject({ kind: 'more-fighters-than-pools', clubId: CLUBS.saltmarsh })
    expect(note!.fighterIds).toHaveLength(2)
    expect(note!.message).toMatch(/the club has 4 fighters for 3 pools/)
  })

  it('notes a clash the seed bands leave no way around', () => {
    // 3 pools, 7 entries: pool 1 holds seed 7, one of seeds 1-3 and one of seeds 4-6. Greyfield
    // has 1, 5, 7 and Old Mill 2, 3, 6, so every choice meets a clubmate.
    const greyfield = [1, 5, 7]
    const oldMill = [2, 3, 6]
    const entries = [1, 2, 3, 4, 5, 6, 7].map(seed => entry(seed * 10, seed,
      greyfield.includes(seed) ? CLUBS.greyfield : oldMill.includes(seed) ? CLUBS.oldMill : null))
    const draw = drawPools(entries, 3)
    expect(clashPairs(draw.pools)).toBe(1)
    expect(draw.notes).toHaveLength(1)
    expect(draw.notes[0]).toMatchObject({ kind: 'kept-for-seeding', pool: 0 })
    expect(draw.notes[0]!.message).toMatch(/^Pool 1 holds 2 fighters of club/)
  })

  it('moves fighters only within their serpentine row, so every pool keeps its seed bands', () => {
    fc.assert(fc.property(drawArb, ([entries, poolCount, drawKey]) => {
      const order = drawOrder(entries, drawKey)
      const rowOf = new Map(order.map((e, k) => [e.id, Math.floor(k / poolCount)]))
      const bands = (pools: readonly (readonly Entry[])[]) => pools.map(pool => pool.map(e => rowOf.get(e.id)!).sort((a, b) => a - b))
      const plain = drawPools(entries, poolCount, { drawKey, separateClubs: false })
      const parted = drawPools(entries, poolCount, { drawKey })
      expect(bands(parted.pools)).toEqual(bands(plain.pools))
    }))
  })

  it('never leaves more same-club pairs than the plain serpentine, and notes every one left', () => {
    fc.assert(fc.property(drawArb, ([entries, poolCount, drawKey]) => {
      const plain = drawPools(entries, poolCount, { drawKey, separateClubs: false })
      const parted = drawPools(entries, poolCount, { drawKey })
      expect(clashPairs(parted.pools)).toBeLessThanOrEqual(clashPairs(plain.pools))
      const noted = parted.notes.reduce((sum, n) => sum + n.fighterIds.length * (n.fighterIds.length - 1) / 2, 0)
      expect(noted).toBe(clashPairs(parted.pools))
    }))
  })

  it('lists as moves exactly the fighters placed away from the plain serpentine', () => {
    fc.assert(fc.property(drawArb, ([entries, poolCount, drawKey]) => {
      const plain = drawPools(entries, poolCount, { drawKey, separateClubs: false })
      const parted = drawPools(entries, poolCount, { drawKey })
      const poolOf = (pools: readonly (readonly Entry[])[], id: number) => pools.findIndex(p => p.some(e => e.id === id))
      const moved = entries.filter(e => poolOf(plain.pools, e.id) !== poolOf(parted.pools, e.id)).map(e => e.id).sort((a, b) => a - b)
      expect(parted.moves.map(m => m.fighterId).sort((a, b) => a - b)).toEqual(moved)
    }))
  })
})

describe('assignment (Hungarian method)', () => {
  it('finds the cheapest assignment, as trying every one does', () => {
    const matrix = fc.integer({ min: 1, max: 6 }).chain(n => fc.array(fc.array(fc.integer({ min: 0, max: 50 }), { minLength: n, maxLength: n }), { minLength: n, maxLength: n }))
    fc.assert(fc.property(matrix, (cost) => {
      const n = cost.length
      const total = (columns: readonly number[]) => columns.reduce((sum, column, row) => sum + cost[row]![column]!, 0)
      const chosen = assign(cost)
      expect([...chosen].sort()).toEqual(Array.from({ length: n }, (_, i) => i))
      const cheapest = Math.min(...permutations(Array.from({ length: n }, (_, i) => i)).map(total))
      expect(total(chosen)).toBe(cheapest)
    }))
  })
})

describe('validateMove', () => {
  const pools: Entry[][] = [
    [entry(1, 1, CLUBS.saltmarsh), entry(6, 6, CLUBS.northDowns), entry(7, null, CLUBS.ironquay)],
    [entry(2, 2, CLUBS.ironquay), entry(5, 5, CLUBS.greyfield)],
    [entry(3, 3, CLUBS.lanterngate), entry(4, 4, CLUBS.oldMill)],
  ]

  it('allows a plain move and places the fighter by seed', () => {
    const check = validateMove(pools, 6, 2)
    expect(check).toEqual({ allowed: true, warnings: [], pools: [
      [pools[0]![0], pools[0]![2]],
      pools[1],
      [pools[2]![0], pools[2]![1], pools[0]![1]],
    ] })
    const early = validateMove(pools, 1, 2)
    expect(early.allowed && idsOf(early.pools)[2]).toEqual([1, 3, 4])
  })

  it('leaves the pools it was given as they were', () => {
    const before = structuredClone(pools)
    validateMove(pools, 6, 2)
    expect(pools).toEqual(before)
  })

  it('refuses a move that leaves a pool with fewer than two, or than the set minimum', () => {
    expect(validateMove(pools, 2, 0)).toEqual({ allowed: false, reason: 'Pool 2 would keep 1 fighter, fewer than 2' })
    expect(validateMove(pools, 1, 1, { minSize: 3 })).toEqual({ allowed: false, reason: 'Pool 1 would keep 2 fighters, fewer than 3' })
  })

  it('warns, without refusing, when two of one club meet', () => {
    const check = validateMove(pools, 7, 1)
    expect(check.allowed).toBe(true)
    expect(check.allowed && check.warnings.map(w => w.kind)).toEqual(['same-club'])
  })

  it('warns when pool sizes would differ by more than one', () => {
    const wider: Entry[][] = [[entry(1, 1), entry(2, 2), entry(3, 3)], [entry(4, 4), entry(5, 5), entry(6, 6)]]
    const check = validateMove(wider, 1, 1)
    expect(check.allowed && check.warnings).toEqual([{ kind: 'uneven-sizes', message: 'Pool sizes would be 2, 4, differing by more than one' }])
  })

  it('refuses an unknown fighter, an unknown pool and a move to the same pool', () => {
    expect(validateMove(pools, 99, 0)).toMatchObject({ allowed: false, reason: 'Fighter 99 is in none of the pools' })
    expect(validateMove(pools, 6, 3)).toMatchObject({ allowed: false, reason: 'There is no pool 4' })
    expect(validateMove(pools, 6, 0)).toMatchObject({ allowed: false, reason: 'Fighter 6 is already in pool 1' })
  })
})
