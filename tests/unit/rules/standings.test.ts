import { describe, expect, it } from 'vitest'
import { computeStandings, drawLot, firstHitThreeBouts, pointsToSeven } from '../../../shared/rules'
import type { Pool, PoolMatch, RuleSet, StandingRow, TieBreaker } from '../../../shared/rules'
import { afterblow, card, clean, concede, double, finished, log, pairs, rules, timeUp, unfought } from './helpers'

// Invented fighters (ids are what the desk stores; names in comments).
const ADA = 'ada' // Ada Brackwater, Saltmarsh Sword Guild
const MARA = 'mara' // Mara Holloway, Ironquay Fencing Hall
const WREN = 'wren' // Wren Ashby, North Downs Buckler Circle
const PIERS = 'piers' // Piers Lumley, Lanterngate Historical Fencing

const pool = (fighters: string[], matches: PoolMatch[], lotSeed = 'wrenmouth-harvest-open/sword-buckler/pool-1'): Pool =>
  ({ fighters: fighters.map(id => ({ id })), matches, lotSeed })
const order = (rows: StandingRow[]) => rows.map(r => r.fighterId)
const row = (rows: StandingRow[], id: string) => rows.find(r => r.fighterId === id)!
const ranked = (ruleSet: RuleSet, ranking: TieBreaker[]) => ({ ...ruleSet, ranking })

describe('pool numbers', () => {
  it('gives each fighter of a pool of nine 8 × 3 = 24 bouts (common practice, no source)', () => {
    const nine = ['ada', 'tobin', 'mara', 'cato', 'wren', 'oswin', 'isolde', 'piers', 'hollis']
    const matches = pairs(nine).map(([a, b], i) => finished(`m${i}`, a, b, log(clean('a'), double(), clean('b'))))
    const { rows } = computeStandings(firstHitThreeBouts, pool(nine, matches))
    expect(rows.map(r => r.boutsFought)).toEqual(Array.from({ length: 9 }, () => 24))
    expect(rows.map(r => r.matchesFought)).toEqual(Array.from({ length: 9 }, () => 8))
    // each match: one bout unharmed, two hit (the double and the opponent's clean hit) → 8 and 16.
    expect(rows.every(r => r.unharmedBouts === 8 && r.hitBouts === 16)).toBe(true)
  })

  it('counts an afterblow in the survival format as harm to both (common practice, no source)', () => {
    const hits = log(afterblow('a', ['head', 'cut'], ['arms', 'cut']), afterblow('b', ['torso', 'cut'], ['legs', 'cut']), afterblow('a', ['head', 'cut'], ['head', 'cut']))
    const { rows } = computeStandings(firstHitThreeBouts, pool([ADA, MARA], [finished('m1', ADA, MARA, hits)]))
    for (const r of rows) expect([r.unharmedBouts, r.hitBouts, r.survivalRate, r.afterblowsReceived]).toEqual([0, 3, 0, r.fighterId === ADA ? 2 : 1])
    // full afterblow: Ada 3 + 1 + 3 = 7, Mara 1 + 2 + 3 = 6.
    expect([row(rows, ADA).pointsScored, row(rows, MARA).pointsScored]).toEqual([7, 6])
  })

  it('adds up wins, losses, draws, points, indicator, doubles and cards', () => {
    // Ada–Mara: a head 3, b torso 2, double → 3–2 Ada. Ada–Wren: 2–2 draw (torso, torso, double) with a yellow to Wren.
    // Mara–Wren: Wren arms ×3 → 0–3 Wren.
    const matches = [
      finished('m1', ADA, MARA, log(clean('a', 'head'), clean('b'), double())),
      finished('m2', ADA, WREN, log(clean('a'), card('b', 'yellow'), clean('b'), double())),
      finished('m3', MARA, WREN, log(clean('b', 'arms'), clean('b', 'arms'), clean('b', 'arms'))),
    ]
    const { rows } = computeStandings(firstHitThreeBouts, pool([ADA, MARA, WREN], matches))
    expect(row(rows, ADA)).toMatchObject({ wins: 1, draws: 1, losses: 0, pointsScored: 5, pointsReceived: 4, indicator: 1, doubles: 2 })
    expect(row(rows, MARA)).toMatchObject({ wins: 0, draws: 0, losses: 2, pointsScored: 2, pointsReceived: 6, indicator: -4, doubles: 1 })
    expect(row(rows, WREN)).toMatchObject({ wins: 1, draws: 1, losses: 0, pointsScored: 5, pointsReceived: 2, cards: { yellows: 1, reds: 0 } })
    // Survival preset: Wren 1 + 3 = 4 unharmed, Ada 1 + 1 = 2, Mara 1 + 0 = 1.
    expect(order(rows)).toEqual([WREN, ADA, MARA])
    expect(row(rows, MARA).survivalRate).toBeCloseTo(1 / 6)
  })

  it('does not depend on the order the matches are given in', () => {
    const matches = pairs([ADA, MARA, WREN, PIERS]).map(([a, b], i) => finished(`m${i}`, a, b, log(clean(i % 2 ? 'a' : 'b', 'head'), double(), clean('a'))))
    const forward = computeStandings(firstHitThreeBouts, pool([ADA, MARA, WREN, PIERS], matches))
    const backward = computeStandings(firstHitThreeBouts, pool([PIERS, WREN, MARA, ADA], [...matches].reverse()))
    expect(backward).toEqual(forward)
  })

  it('lets a finished match stand as scored when the log shows no end (the director\'s word)', () => {
    const { matches } = computeStandings(pointsToSeven, pool([ADA, MARA], [finished('m1', ADA, MARA, log(clean('b', 'head')))]))
    expect(matches[0]).toMatchObject({ counted: 'result', result: 'b', score: { a: 0, b: 3 } })
  })

  it('leaves an unfought match out of the table', () => {
    const { rows, matches } = computeStandings(firstHitThreeBouts, pool([ADA, MARA], [unfought('m1', ADA, MARA, log(clean('a')))]))
    expect(matches[0]!.counted).toBe('pending')
    expect(rows.every(r => r.boutsFought === 0 && r.survivalRate === null)).toBe(true)
  })
})

describe('tie-breakers', () => {
  // Ada–Wren: Ada torso, then Wren concedes (1 bout). Ada–Mara: a, a, b → Ada 2 of 3, Mara 1 of 3.
  // Mara–Wren: Mara ×3. Ada 3 unharmed of 4 bouts (0.75); Mara 4 of 6 (0.667); Wren 0 of 4.
  const survival = pool([ADA, MARA, WREN], [
    finished('m1', ADA, WREN, log(clean('a'), concede('b'))),
    finished('m2', ADA, MARA, log(clean('a'), clean('a'), clean('b'))),
    finished('m3', MARA, WREN, log(clean('a'), clean('a'), clean('a'))),
  ])

  it('unharmedBouts: more first', () => {
    const { rows } = computeStandings(ranked(firstHitThreeBouts, ['unharmedBouts']), survival)
    expect(order(rows)).toEqual([MARA, ADA, WREN])
    expect(rows.map(r => r.unharmedBouts)).toEqual([4, 3, 0])
    expect(rows.map(r => r.separatedBy)).toEqual(['unharmedBouts', 'unharmedBouts', null])
  })

  it('survivalRate: highest first', () => {
    const { rows } = computeStandings(ranked(firstHitThreeBouts, ['survivalRate']), survival)
    expect(order(rows)).toEqual([ADA, MARA, WREN])
    expect(rows.map(r => r.survivalRate)).toEqual([3 / 4, 4 / 6, 0])
  })

  // Points to seven. Ada–Mara: Mara head, head (6), Ada head, head, arms → 7–6.
  // Ada–Wren: Wren head, torso (5), Ada head, head, arms → 7–5. Mara–Wren: Mara head, head, arms → 7–0.
  // Ada: 2 wins, scored 14, received 11, indicator +3. Mara: 1 win, 13, 7, +6. Wren: 0 wins, 5, 14, −9.
  const points = pool([ADA, MARA, WREN], [
    finished('m1', ADA, MARA, log(clean('b', 'head'), clean('b', 'head'), clean('a', 'head'), clean('a', 'head'), clean('a', 'arms'))),
    finished('m2', ADA, WREN, log(clean('b', 'head'), clean('b'), clean('a', 'head'), clean('a', 'head'), clean('a', 'arms'))),
    finished('m3', MARA, WREN, log(clean('a', 'head'), clean('a', 'head'), clean('a', 'arms'))),
  ])

  it('wins: more first', () => {
    const { rows } = computeStandings(ranked(pointsToSeven, ['wins']), points)
    expect(order(rows)).toEqual([ADA, MARA, WREN])
    expect(rows.map(r => [r.wins, r.pointsScored, r.pointsReceived, r.indicator])).toEqual([[2, 14, 11, 3], [1, 13, 7, 6], [0, 5, 14, -9]])
  })

  it('indicator: scored minus received, highest first', () => {
    expect(order(computeStandings(ranked(pointsToSeven, ['indicator']), points).rows)).toEqual([MARA, ADA, WREN])
  })

  it('pointsScored: more first', () => {
    expect(order(computeStandings(ranked(pointsToSeven, ['pointsScored']), points).rows)).toEqual([ADA, MARA, WREN])
  })

  it('pointsReceived: fewer first', () => {
    expect(order(computeStandings(ranked(pointsToSeven, ['pointsReceived']), points).rows)).toEqual([MARA, ADA, WREN])
  })

  it('doubles: fewer first', () => {
    // Ada–Mara 1 double, Ada–Wren none, Mara–Wren 2 → Ada 1, Mara 3, Wren 2.
    const doubles = pool([ADA, MARA, WREN], [
      finished('m1', ADA, MARA, log(double(), clean('a'), clean('b'))),
      finished('m2', ADA, WREN, log(clean('a'), clean('a'), clean('a'))),
      finished('m3', MARA, WREN, log(double(), double(), clean('b'))),
    ])
    const { rows } = computeStandings(ranked(firstHitThreeBouts, ['doubles']), doubles)
    expect(order(rows)).toEqual([ADA, WREN, MARA])
    expect(rows.map(r => r.doubles)).toEqual([1, 2, 3])
  })

  it('applies the tie-breakers in the rule set\'s order', () => {
    // Same pool, two orders: wins first puts Ada on top, indicator first puts Mara there.
    expect(order(computeStandings(ranked(pointsToSeven, ['wins', 'indicator']), points).rows)[0]).toBe(ADA)
    expect(order(computeStandings(ranked(pointsToSeven, ['indicator', 'wins']), points).rows)[0]).toBe(MARA)
  })

  it('headToHead: a mini-table among a three-way tie', () => {
    // Each match: the winner's head cut 3, the loser's torso 2, then a double (scores nothing).
    // Ada beats Mara, Ada beats Wren, Mara beats Wren; everyone has 2 unharmed bouts.
    // Mini-table: Ada 2, Mara 1, Wren 0.
    const win = () => log(clean('a', 'head'), clean('b'), double())
    const tie = pool([ADA, MARA, WREN], [finished('m1', ADA, MARA, win()), finished('m2', ADA, WREN, win()), finished('m3', MARA, WREN, win())])
    const { rows, lot } = computeStandings(ranked(firstHitThreeBouts, ['unharmedBouts', 'headToHead']), tie)
    expect(rows.map(r => r.unharmedBouts)).toEqual([2, 2, 2])
    expect(order(rows)).toEqual([ADA, MARA, WREN])
    expect(rows.map(r => r.separatedBy)).toEqual(['headToHead', 'headToHead', null])
    expect(lot.draws).toEqual([])
  })

  it('headToHead: drawn again among those the mini-table leaves level', () => {
    // Wins: Ada over Mara and Wren; Mara over Wren and Piers; Wren over Piers; Piers over Ada.
    // Mini-table of four: Ada 2, Mara 2, Wren 1, Piers 1; again between Ada and Mara: Ada; between Wren and Piers: Wren.
    const won = (winner: 'a' | 'b') => log(clean(winner, 'head'), clean(winner, 'head'), clean(winner, 'head'))
    const four = pool([ADA, MARA, WREN, PIERS], [
      finished('m1', ADA, MARA, won('a')),
      finished('m2', ADA, WREN, won('a')),
      finished('m3', ADA, PIERS, won('b')),
      finished('m4', MARA, WREN, won('a')),
      finished('m5', MARA, PIERS, won('a')),
      finished('m6', WREN, PIERS, won('a')),
    ])
    const { rows } = computeStandings(ranked(pointsToSeven, ['headToHead']), four)
    expect(order(rows)).toEqual([ADA, MARA, WREN, PIERS])
    expect(rows.map(r => r.separatedBy)).toEqual(['headToHead', 'headToHead', 'headToHead', null])
  })
})

describe('the drawn lot', () => {
  // A circle: Ada beats Mara, Mara beats Wren, Wren beats Ada, each head 3 against torso 2, then a
  // double. Every number is level (2 unharmed, 5 scored, 5 received, 2 doubles, 1 head-to-head win).
  const circle = (seed?: string) => pool([ADA, MARA, WREN], [
    finished('m1', ADA, MARA, log(clean('a', 'head'), clean('b'), double())),
    finished('m2', MARA, WREN, log(clean('a', 'head'), clean('b'), double())),
    finished('m3', WREN, ADA, log(clean('a', 'head'), clean('b'), double())),
  ], seed)

  it('separates fighters level on everything and records the draw', () => {
    const standings = computeStandings(firstHitThreeBouts, circle())
    expect(standings.rows.map(r => [r.unharmedBouts, r.pointsScored, r.pointsReceived, r.doubles])).toEqual([[2, 5, 5, 2], [2, 5, 5, 2], [2, 5, 5, 2]])
    const expected = drawLot('wrenmouth-harvest-open/sword-buckler/pool-1', [ADA, MARA, WREN])
    expect(standings.lot).toEqual({ seed: 'wrenmouth-harvest-open/sword-buckler/pool-1', draws: [expected] })
    expect(order(standings.rows)).toEqual(expected.order)
    expect(standings.rows.map(r => r.separatedBy)).toEqual(['lot', 'lot', null])
  })

  it('draws the same order for the same seed, whatever order fighters and matches come in', () => {
    const once = computeStandings(firstHitThreeBouts, circle('seed-7'))
    const again = computeStandings(firstHitThreeBouts, { ...circle('seed-7'), fighters: [{ id: WREN }, { id: ADA }, { id: MARA }], matches: [...circle().matches].reverse() })
    expect(again.rows).toEqual(once.rows)
    expect(again.lot).toEqual(once.lot)
  })

  it('draws different orders for different seeds', () => {
    const orders = new Set(Array.from({ length: 24 }, (_, i) => order(computeStandings(firstHitThreeBouts, circle(`seed-${i}`)).rows).join(' ')))
    // 3 fighters have 6 orders; 24 seeds landing on one would be a broken draw.
    expect(orders.size).toBeGreaterThan(2)
  })
})

describe('withdrawn and expelled fighters', () => {
  // Ada–Mara fought (Ada head ×3: 9–0); then Mara withdraws; Mara–Wren and Ada–Wren still to fence.
  const withdrawal = (ruleSet: RuleSet) => computeStandings(ruleSet, {
    fighters: [{ id: ADA }, { id: MARA, withdrawn: true }, { id: WREN }],
    matches: [
      finished('m1', ADA, MARA, log(clean('a', 'head'), clean('a', 'head'), clean('a', 'head'))),
      unfought('m2', MARA, WREN),
      unfought('m3', ADA, WREN),
    ],
    lotSeed: 'p',
  })

  it('forfeit-remaining: fought matches stand, unfought ones are forfeit losses', () => {
    const { rows, matches } = withdrawal(pointsToSeven)
    expect(matches.map(m => [m.matchId, m.counted, m.forfeitedBy, m.result])).toEqual([
      ['m1', 'result', null, 'a'],
      ['m2', 'forfeit', 'a', 'b'],
      ['m3', 'pending', null, null],
    ])
    expect(row(rows, ADA)).toMatchObject({ wins: 1, pointsScored: 9 })
    expect(row(rows, MARA)).toMatchObject({ withdrawn: true, active: false, losses: 2, forfeitLosses: 1, pointsReceived: 9 })
    expect(row(rows, WREN)).toMatchObject({ wins: 1, forfeitWins: 1, matchesFought: 0, boutsFought: 0 })
    expect(order(rows)).toEqual([ADA, WREN, MARA])
    expect(rows[1]!.separatedBy).toBe('standing')
  })

  it('annul-all: every match of the withdrawn fighter leaves everyone\'s table', () => {
    const { rows, matches } = withdrawal(firstHitThreeBouts)
    expect(matches.map(m => m.counted)).toEqual(['annulled', 'annulled', 'pending'])
    expect(row(rows, ADA)).toMatchObject({ wins: 0, boutsFought: 0, pointsScored: 0 })
    expect(row(rows, MARA)).toMatchObject({ withdrawn: true, losses: 0, boutsFought: 0 })
    expect(rows[rows.length - 1]!.fighterId).toBe(MARA)
  })

  it('black card: the match is lost and every remaining match is forfeited, even under annul-all', () => {
    // Ada leads Mara 3–0, then a black card to Ada: Mara wins m1; Ada–Wren becomes a forfeit.
    const { rows, matches } = computeStandings(firstHitThreeBouts, pool([ADA, MARA, WREN], [
      finished('m1', ADA, MARA, log(clean('a', 'head'), card('a', 'black'))),
      unfought('m2', ADA, WREN),
      finished('m3', MARA, WREN, log(clean('a'), clean('b'), clean('b'))),
    ]))
    expect(matches.map(m => [m.counted, m.result])).toEqual([['result', 'b'], ['forfeit', 'b'], ['result', 'b']])
    expect(row(rows, ADA)).toMatchObject({ expelled: true, active: false, losses: 2, forfeitLosses: 1, cards: { blacks: 1 }, boutsFought: 1 })
    expect(row(rows, WREN)).toMatchObject({ wins: 2, forfeitWins: 1 })
    expect(order(rows)[2]).toBe(ADA)
  })

  it('takes an expulsion from the fighter list as well as from a black card', () => {
    const { rows, matches } = computeStandings(pointsToSeven, {
      fighters: [{ id: ADA, expelled: true }, { id: MARA }],
      matches: [unfought('m1', ADA, MARA)],
      lotSeed: 'p',
    })
    expect(matches[0]).toMatchObject({ counted: 'forfeit', forfeitedBy: 'a', result: 'b' })
    expect(row(rows, MARA).wins).toBe(1)
  })

  it('counts a match between two fighters who are both gone as lost by both', () => {
    const { matches } = computeStandings(pointsToSeven, {
      fighters: [{ id: ADA, withdrawn: true }, { id: MARA, expelled: true }],
      matches: [unfought('m1', ADA, MARA)],
      lotSeed: 'p',
    })
    expect(matches[0]).toMatchObject({ counted: 'forfeit', forfeitedBy: 'both', result: 'both-lose' })
  })

  it('takes a forfeit the organiser records', () => {
    const { rows } = computeStandings(pointsToSeven, pool([ADA, MARA], [{ id: 'm1', a: ADA, b: MARA, status: 'forfeit', forfeitedBy: 'b', entries: [] }]))
    expect(row(rows, ADA)).toMatchObject({ wins: 1, forfeitWins: 1, matchesFought: 0 })
  })
})

describe('pool checks', () => {
  it('refuses a match naming someone outside the pool, or a fighter twice', () => {
    expect(() => computeStandings(pointsToSeven, pool([ADA], [finished('m1', ADA, MARA, [])]))).toThrow(/not in the pool/)
    expect(() => computeStandings(pointsToSeven, pool([ADA, ADA], []))).toThrow(/twice/)
    expect(() => computeStandings(pointsToSeven, pool([ADA], [finished('m1', ADA, ADA, [])]))).toThrow(/against themselves/)
  })

  it('treats time called as the end of a points match', () => {
    const { rows } = computeStandings(rules('points-to-seven'), pool([ADA, MARA], [finished('m1', ADA, MARA, log(clean('a'), timeUp()))]))
    expect(row(rows, ADA).wins).toBe(1)
  })
})
