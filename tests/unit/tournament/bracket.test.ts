import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import type { FinalMatchState, Bracket } from '../../../shared/tournament'
import {
  BRONZE_MATCH_ID,
  POOL_ORDER_TABLES,
  advance,
  bergerOrder,
  bracketPlaces,
  bracketSize,
  buildBracket,
  openFinalMatches,
  readyMatches,
  reopen,
  roundName,
  roundRobinFinal,
  seedOrder,
  toPairings,
} from '../../../shared/tournament'

/** Fighter ids for seeds 1..n: seed s is fighter 100 + s. */
const field = (n: number) => Array.from({ length: n }, (_, i) => 101 + i)
const seedOf = (id: number) => id - 100

/** Fight every ready match until none is left, the winner chosen by `pick`. */
function fightOut(bracket: Bracket, pick: (a: number, b: number, step: number) => number): Bracket {
  let step = 0
  for (let ready = readyMatches(bracket); ready.length > 0; ready = readyMatches(bracket)) {
    const match = ready[0]!
    const [a, b] = match.sides.map(s => s.fighterId!) as [number, number]
    bracket = advance(bracket, match.id, pick(a, b, step++))
  }
  return bracket
}

// Bracket seeding is common practice (DOMAIN.md): the first round pairs seed s with N + 1 - s,
// seeds 1 and 2 sit in opposite halves, 1 to 4 in different quarters. Order of 8: 1,8,4,5,2,7,3,6.
describe('seedOrder', () => {
  it('gives 1, 8, 4, 5, 2, 7, 3, 6 for a bracket of 8 (common practice)', () => {
    expect(seedOrder(8)).toEqual([1, 8, 4, 5, 2, 7, 3, 6])
  })

  it('gives 1, 2 for a final and 1, 4, 2, 3 for semifinals', () => {
    expect(seedOrder(2)).toEqual([1, 2])
    expect(seedOrder(4)).toEqual([1, 4, 2, 3])
  })

  it('refuses a size that is not a power of two', () => {
    expect(() => seedOrder(6)).toThrow(/power of two/)
    expect(() => seedOrder(1)).toThrow(/power of two from 2/)
  })
})

describe('buildBracket for every field from 2 to 64 (common practice)', () => {
  const sizes = Array.from({ length: 63 }, (_, i) => i + 2)

  it('uses the next power of two and places every seed exactly once', () => {
    for (const n of sizes) {
      const bracket = buildBracket(field(n))
      expect(bracket.size).toBe(bracketSize(n))
      expect(bracket.size).toBeGreaterThanOrEqual(n)
      expect(bracket.size / 2).toBeLessThan(n)
      const first = bracket.matches.filter(m => m.round === 1)
      expect(first).toHaveLength(bracket.size / 2)
      const placed = first.flatMap(m => m.sides.filter(s => !s.bye).map(s => s.fighterId!))
      expect(placed.sort((a, b) => a - b)).toEqual(field(n))
    }
  })

  it('pairs seed s with size + 1 - s in the first round when the field is full', () => {
    for (const n of [2, 4, 8, 16, 32, 64]) {
      for (const match of buildBracket(field(n)).matches.filter(m => m.round === 1)) {
        expect(match.sides[0].seed! + match.sides[1].seed!).toBe(n + 1)
      }
    }
  })

  it('puts seeds 1 and 2 in opposite halves and seeds 1 to 4 in different quarters', () => {
    for (const n of sizes) {
      const bracket = buildBracket(field(n))
      // Line of the bracket, top to bottom: two lines per first-round match.
      const lineOf = (seed: number) => {
        const match = bracket.matches.find(m => m.round === 1 && m.sides.some(s => s.seed === seed))!
        return 2 * match.slot + match.sides.findIndex(s => s.seed === seed)
      }
      const half = bracket.size / 2
      expect(Math.floor(lineOf(1) / half)).not.toBe(Math.floor(lineOf(2) / half))
      if (n >= 4) {
        const quarter = bracket.size / 4
        expect(new Set([1, 2, 3, 4].map(seed => Math.floor(lineOf(seed) / quarter))).size).toBe(4)
      }
    }
  })

  it('gives the byes to the top seeds only, and they go through on their own', () => {
    for (const n of sizes) {
      const bracket = buildBracket(field(n))
      const byes = bracket.matches.filter(m => m.status === 'bye')
      expect(byes).toHaveLength(bracket.size - n)
      const seeds = byes.map(m => seedOf(m.winnerId!)).sort((a, b) => a - b)
      expect(seeds).toEqual(Array.from({ length: bracket.size - n }, (_, i) => i + 1))
      for (const bye of byes) {
        const next = bracket.matches.find(m => m.id === bye.winnerTo!.matchId)!
        expect(next.sides[bye.winnerTo!.side].fighterId).toBe(bye.winnerId)
      }
    }
  })

  it('reaches a champion after log2(size) rounds, whoever wins each match', () => {
    fc.assert(fc.property(fc.integer({ min: 2, max: 64 }), fc.array(fc.boolean(), { minLength: 64, maxLength: 64 }), (n, coin) => {
      const done = fightOut(buildBracket(field(n)), (a, b, step) => (coin[step % 64] ? a : b))
      const final = done.matches.find(m => m.name === 'Final')!
      expect(final.round).toBe(Math.log2(bracketSize(n)))
      expect(done.roundCount).toBe(Math.log2(bracketSize(n)))
      const champion = bracketPlaces(done).first!
      expect(champion).toBe(final.winnerId)
      // The champion won (or had a bye in) one match in every round.
      for (let round = 1; round <= done.roundCount; round++) {
        expect(done.matches.filter(m => m.round === round && m.winnerId === champion)).toHaveLength(1)
      }
      expect(done.matches.every(m => m.status === 'done' || m.status === 'bye')).toBe(true)
    }), { numRuns: 60 })
  })

  it('crowns seed 1 when the better seed always wins', () => {
    for (const n of [2, 3, 5, 12, 33]) {
      const done = fightOut(buildBracket(field(n)), (a, b) => Math.min(a, b))
      expect(bracketPlaces(done)).toMatchObject({ first: 101, second: 102 })
    }
  })

  it('names the rounds from the end', () => {
    const names = [...new Set(buildBracket(field(20)).matches.map(m => m.name))]
    expect(names).toEqual(['Round of 32', 'Round of 16', 'Quarterfinal', 'Semifinal', 'Final'])
    expect(roundName(1, 1)).toBe('Final')
  })

  it('refuses fewer than 2 fighters and a fighter ranked twice', () => {
    expect(() => buildBracket([101])).toThrow(/at least 2 fighters/)
    expect(() => buildBracket([101, 102, 101])).toThrow(/ranked twice/)
  })
})

describe('advance', () => {
  it('moves the winner on and leaves the bracket it was given unchanged', () => {
    const start = buildBracket(field(4))
    const before = structuredClone(start)
    const next = advance(start, 'r1m1', 104)
    expect(start).toEqual(before)
    const m1 = next.matches.find(m => m.id === 'r1m1')!
    expect(m1).toMatchObject({ status: 'done', winnerId: 104, loserId: 101 })
    expect(next.matches.find(m => m.id === 'r2m1')!.sides[0]).toEqual({ fighterId: 104, seed: 4, bye: false })
  })

  it('refuses a match that is not ready, already decided, a bye, unknown, or a winner not in it', () => {
    const bracket = buildBracket(field(3))
    expect(() => advance(bracket, 'r2m1', 101)).toThrow(/Match r2m1 is not ready/)
    expect(() => advance(bracket, 'r1m1', 101)).toThrow(/Match r1m1 is a bye/)
    expect(() => advance(bracket, 'r9m9', 101)).toThrow(/There is no match r9m9/)
    expect(() => advance(bracket, 'r1m2', 101)).toThrow(/Fighter 101 is not in match r1m2/)
    const decided = advance(bracket, 'r1m2', 102)
    expect(() => advance(decided, 'r1m2', 103)).toThrow(/Match r1m2 is already decided/)
  })

  it('sends the semifinal losers to the bronze match, which is ready once both are in', () => {
    let bracket = buildBracket(field(4), { bronze: true })
    expect(bracket.matches.map(m => m.name)).toEqual(['Semifinal', 'Semifinal', 'Final', 'Bronze match'])
    bracket = advance(bracket, 'r1m1', 101)
    expect(bracket.matches.find(m => m.id === BRONZE_MATCH_ID)!.status).toBe('waiting')
    bracket = advance(bracket, 'r1m2', 103)
    const bronze = bracket.matches.find(m => m.id === BRONZE_MATCH_ID)!
    expect(bronze.status).toBe('ready')
    expect(bronze.sides.map(s => s.fighterId)).toEqual([104, 102])
    expect(readyMatches(bracket).map(m => m.id)).toEqual([BRONZE_MATCH_ID, 'r2m1'])
    bracket = advance(advance(bracket, BRONZE_MATCH_ID, 102), 'r2m1', 103)
    expect(bracketPlaces(bracket)).toEqual({ first: 103, second: 101, third: [102], fourth: 104 })
  })

  it('refuses a bronze match for fewer than four fighters', () => {
    expect(() => buildBracket(field(3), { bronze: true })).toThrow(/at least 4 fighters/)
  })

  it('shares third place between the semifinal losers when there is no bronze match', () => {
    const done = fightOut(buildBracket(field(4)), (a, b) => Math.min(a, b))
    expect(bracketPlaces(done)).toEqual({ first: 101, second: 102, third: [104, 103], fourth: null })
  })
})

describe('readyMatches', () => {
  it('lists the first round\'s real matches, top to bottom, byes left out', () => {
    const bracket = buildBracket(field(6))
    // Bracket of 8: seeds 1 and 2 have byes; 4-5 and 3-6 fence.
    expect(readyMatches(bracket).map(m => m.sides.map(s => s.seed))).toEqual([[4, 5], [3, 6]])
  })
})

describe('reopen', () => {
  it('undoes a decided match while nothing after it is decided', () => {
    const start = buildBracket(field(4), { bronze: true })
    const once = advance(start, 'r1m1', 101)
    expect(reopen(once, 'r1m1')).toEqual(start)
  })

  it('refuses once a match it fed is decided, and refuses an undecided match', () => {
    let bracket = buildBracket(field(4))
    bracket = advance(advance(bracket, 'r1m1', 101), 'r1m2', 102)
    bracket = advance(bracket, 'r2m1', 101)
    expect(() => reopen(bracket, 'r1m1')).toThrow(/r2m1 has been decided since/)
    expect(() => reopen(buildBracket(field(4)), 'r1m1')).toThrow(/not decided/)
  })
})

describe('roundRobinFinal', () => {
  it('fences the final four by the pool order table of 4, positions by ranking', () => {
    const ranked = [31, 17, 24, 9]
    expect(roundRobinFinal(ranked)).toEqual(toPairings(POOL_ORDER_TABLES[4], ranked))
    expect(roundRobinFinal(ranked)[0]).toEqual([31, 9])
  })

  it('can use the Berger tables instead', () => {
    const ranked = [31, 17, 24, 9]
    expect(roundRobinFinal(ranked, 'berger')).toEqual(toPairings(bergerOrder(4), ranked))
  })
})

describe('open final matches', () => {
  const m = (status: FinalMatchState['status'], winner: FinalMatchState['winner'] = null): FinalMatchState => ({ status, winner })
  it('counts a level bracket match as open until the director settles it, but not a round robin\'s draw', () => {
    const matches = [m('finished', 'a'), m('finished', 'draw'), m('forfeit', 'b'), m('under-way'), m('scheduled')]
    expect(openFinalMatches('bracket', matches)).toEqual([m('finished', 'draw'), m('under-way'), m('scheduled')])
    expect(openFinalMatches('round-robin', matches)).toEqual([m('under-way'), m('scheduled')])
    expect(openFinalMatches('bracket', [m('finished', 'b'), m('forfeit', 'a')])).toEqual([])
  })
})
