import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  ACTIONS,
  TARGETS,
  TIE_BREAKERS,
  assessQualification,
  computeStandings,
  firstHitThreeBouts,
  pointsToSeven,
} from '../../../shared/rules'
import type { Action, Pool, PoolMatch, RuleSet, Side, StandingRow, Target, TieBreaker } from '../../../shared/rules'
import { afterblow, card, clean, double, log, pairs, voided } from './helpers'
import type { EntryDraft } from './helpers'

const side = fc.constantFrom<Side>('a', 'b')
const hit = fc.tuple(fc.constantFrom<Target>(...TARGETS), fc.constantFrom<Action>(...ACTIONS))

const anyEntry: fc.Arbitrary<EntryDraft> = fc.oneof(
  { weight: 6, arbitrary: fc.tuple(side, hit).map(([s, [t, a]]) => clean(s, t, a)) },
  { weight: 2, arbitrary: fc.tuple(side, hit, hit).map(([s, x, y]) => afterblow(s, x, y)) },
  { weight: 2, arbitrary: fc.tuple(hit, hit).map(([x, y]) => double(x, y)) },
  { weight: 1, arbitrary: fc.constantFrom('not-seen', 'no-valid-hit' as const).map(r => voided(r)) },
  { weight: 1, arbitrary: fc.tuple(side, fc.constantFrom('warning', 'yellow', 'red', 'black' as const)).map(([s, c]) => card(s, c)) },
)

const ruleSetArb: fc.Arbitrary<RuleSet> = fc.tuple(
  fc.constantFrom(firstHitThreeBouts, pointsToSeven),
  fc.shuffledSubarray([...TIE_BREAKERS]),
  fc.constantFrom('forfeit-remaining', 'annul-all' as const),
).map(([base, ranking, withdrawn]) => ({ ...base, ranking, withdrawn }))

const ids = (n: number) => Array.from({ length: n }, (_, i) => `f${i}`)

const poolArb: fc.Arbitrary<Pool> = fc.integer({ min: 2, max: 7 }).chain(n => fc.record({
  flags: fc.array(fc.constantFrom('in', 'in', 'in', 'in', 'withdrawn', 'expelled'), { minLength: n, maxLength: n }),
  matches: fc.array(fc.record({
    status: fc.constantFrom('finished', 'finished', 'finished', 'unfought' as const),
    entries: fc.array(anyEntry, { maxLength: 9 }),
  }), { minLength: n * (n - 1) / 2, maxLength: n * (n - 1) / 2 }),
  seed: fc.string({ maxLength: 8 }),
}).map(({ flags, matches, seed }) => ({
  fighters: ids(n).map((id, i) => ({ id, withdrawn: flags[i] === 'withdrawn', expelled: flags[i] === 'expelled' })),
  matches: pairs(ids(n)).map(([a, b], i): PoolMatch => ({ id: `m${i}`, a, b, status: matches[i]!.status, entries: log(...matches[i]!.entries) })),
  lotSeed: seed,
})))

const value = (row: StandingRow, t: Exclude<TieBreaker, 'headToHead'>): number => {
  switch (t) {
    case 'unharmedBouts': return row.unharmedBouts
    case 'survivalRate': return row.survivalRate ?? -1
    case 'wins': return row.wins
    case 'indicator': return row.indicator
    case 'pointsScored': return row.pointsScored
    case 'pointsReceived': return -row.pointsReceived
    case 'doubles': return -row.doubles
  }
}

describe('standings properties', () => {
  it('do not depend on the order of matches or fighters', () => {
    fc.assert(fc.property(ruleSetArb, poolArb.chain(p => fc.tuple(
      fc.constant(p),
      fc.shuffledSubarray([...p.matches], { minLength: p.matches.length, maxLength: p.matches.length }),
      fc.shuffledSubarray([...p.fighters], { minLength: p.fighters.length, maxLength: p.fighters.length }),
    )), (ruleSet, [p, matches, fighters]) => {
      expect(computeStandings(ruleSet, { ...p, matches, fighters })).toEqual(computeStandings(ruleSet, p))
    }), { numRuns: 150 })
  })

  it('give unharmed + hit bouts = bouts fought for every fighter', () => {
    fc.assert(fc.property(ruleSetArb, poolArb, (ruleSet, p) => {
      for (const row of computeStandings(ruleSet, p).rows) {
        expect(row.unharmedBouts + row.hitBouts).toBe(row.boutsFought)
        expect(row.survivalRate).toBe(row.boutsFought > 0 ? row.unharmedBouts / row.boutsFought : null)
        expect(row.wins + row.losses + row.draws).toBe(row.matchesFought + row.forfeitWins + row.forfeitLosses)
      }
    }), { numRuns: 150 })
  })

  it('rank as a strict total order once the lot is drawn, each step explained', () => {
    fc.assert(fc.property(ruleSetArb, poolArb, (ruleSet, p) => {
      const { rows, lot } = computeStandings(ruleSet, p)
      expect(rows.map(r => r.rank)).toEqual(rows.map((_, i) => i + 1))
      expect([...rows.map(r => r.fighterId)].sort()).toEqual(p.fighters.map(f => f.id).sort())
      const values = ruleSet.ranking.filter((t): t is Exclude<TieBreaker, 'headToHead'> => t !== 'headToHead')
      rows.forEach((row, i) => {
        const next = rows[i + 1]
        if (next === undefined) {
          expect(row.separatedBy).toBeNull()
          return
        }
        if (row.separatedBy === 'standing') {
          expect([row.active, next.active]).toEqual([true, false])
          return
        }
        expect(row.active).toBe(next.active)
        // Everything before the deciding tie-breaker is level; the deciding one (if a value) is higher.
        const at = row.separatedBy === 'lot' ? ruleSet.ranking.length : ruleSet.ranking.indexOf(row.separatedBy!)
        expect(at).toBeGreaterThanOrEqual(0)
        for (const t of ruleSet.ranking.slice(0, at)) if (t !== 'headToHead') expect(value(row, t)).toBe(value(next, t))
        if (row.separatedBy !== 'lot' && row.separatedBy !== 'headToHead') expect(value(row, row.separatedBy!)).toBeGreaterThan(value(next, row.separatedBy!))
        if (row.separatedBy === 'lot') {
          for (const t of values) expect(value(row, t)).toBe(value(next, t))
          const draw = lot.draws.find(d => d.fighterIds.includes(row.fighterId))!
          expect(draw.order.indexOf(row.fighterId)).toBe(draw.order.indexOf(next.fighterId) - 1)
        }
      })
    }), { numRuns: 200 })
  })
})

// ---------------------------------------------------------------------------------------------
// Qualification against brute force: every completion of the bouts still to fence is built as
// real entries and ranked by computeStandings.

interface Spec {
  a: string
  b: string
  fought: EntryDraft[]
  /** Units still to decide: bouts (first-hit) or 0/1 match (points). */
  left: number
}

type Unit = 'a' | 'b' | 'n'

function build(specs: Spec[], outcomes: Unit[][] | null, toEntries: (outcomes: Unit[]) => EntryDraft[]): PoolMatch[] {
  return specs.map((s, i): PoolMatch => {
    const done = outcomes === null ? s.left === 0 : true
    const extra = outcomes === null ? [] : toEntries(outcomes[i]!)
    const entries = log(...s.fought, ...extra).map((e, k) => ({ ...e, id: `m${i}-${k}` }))
    return { id: `m${i}`, a: s.a, b: s.b, status: done ? 'finished' : 'unfought', entries }
  })
}

function* everyCompletion(specs: Spec[]): Generator<Unit[][]> {
  const total = specs.reduce((n, s) => n + s.left, 0)
  for (let code = 0; code < 3 ** total; code++) {
    let rest = code
    yield specs.map(s => Array.from({ length: s.left }, () => {
      const u = (['a', 'b', 'n'] as const)[rest % 3]!
      rest = Math.floor(rest / 3)
      return u
    }))
  }
}

interface Seen {
  rankIn: boolean[]
  surely: boolean[]
  possibly: boolean[]
  meets: boolean[]
  extra: number[]
}

function bruteForce(ruleSet: RuleSet, fighters: string[], specs: Spec[], toEntries: (o: Unit[]) => EntryDraft[], key: (r: StandingRow) => number) {
  const n = ruleSet.qualification.topN ?? fighters.length
  const min = ruleSet.qualification.minSurvivalRate
  const seen: Seen[] = []
  for (const outcomes of everyCompletion(specs)) {
    const { rows } = computeStandings(ruleSet, { fighters: fighters.map(id => ({ id })), matches: build(specs, outcomes, toEntries), lotSeed: 'brute' })
    const k = new Map(rows.map(r => [r.fighterId, key(r)]))
    seen.push({
      rankIn: fighters.map(id => rows.find(r => r.fighterId === id)!.rank <= n),
      surely: fighters.map(id => fighters.filter(o => o !== id && k.get(o)! >= k.get(id)!).length < n),
      possibly: fighters.map(id => fighters.filter(o => o !== id && k.get(o)! > k.get(id)!).length < n),
      meets: fighters.map((id) => {
        const r = rows.find(x => x.fighterId === id)!
        return min !== null && r.survivalRate !== null && r.survivalRate >= min
      }),
      extra: fighters.map(id => specs.reduce((sum, s, i) => sum + outcomes[i]!.filter(u => (s.a === id && u === 'a') || (s.b === id && u === 'b')).length, 0)),
    })
  }
  return seen
}

const firstHitUnit = (outcomes: Unit[]) => outcomes.map(u => (u === 'n' ? double() : clean(u)))
const pointsUnit = (outcomes: Unit[]): EntryDraft[] => outcomes.flatMap((u) => {
  if (u === 'n') return [double(), double(), double()]
  return [clean(u, 'head'), clean(u, 'head'), clean(u, 'head')]
})

const fencedBout: fc.Arbitrary<EntryDraft> = fc.oneof(
  { weight: 4, arbitrary: fc.tuple(side, hit).map(([s, [t, a]]) => clean(s, t, a)) },
  { weight: 1, arbitrary: fc.tuple(side, hit, hit).map(([s, x, y]) => afterblow(s, x, y)) },
  { weight: 1, arbitrary: fc.tuple(hit, hit).map(([x, y]) => double(x, y)) },
)

/** First-hit pools of 3–4 with 0–2 bouts left per match, at most `cap` in all. */
const firstHitCase = (cap: number) => fc.record({
  n: fc.integer({ min: 3, max: 4 }),
  topN: fc.integer({ min: 1, max: 3 }),
  rate: fc.constantFrom(null, 0.5, 0.6),
}).chain(({ n, topN, rate }) => fc.array(fc.record({
  left: fc.integer({ min: 0, max: 2 }),
  bouts: fc.array(fencedBout, { minLength: 3, maxLength: 3 }),
}), { minLength: n * (n - 1) / 2, maxLength: n * (n - 1) / 2 }).map((ms) => {
  let budget = cap
  const specs = pairs(ids(n)).map(([a, b], i): Spec => {
    const left = Math.min(ms[i]!.left, budget)
    budget -= left
    return { a, b, left, fought: ms[i]!.bouts.slice(0, 3 - left) }
  })
  return { fighters: ids(n), topN, rate, specs }
}))

/** Points pools of 3–4: each match decided or still to fence (at most `cap`), perhaps under way. */
const pointsCase = (cap: number) => fc.record({
  n: fc.integer({ min: 3, max: 4 }),
  topN: fc.integer({ min: 1, max: 3 }),
}).chain(({ n, topN }) => fc.array(fc.record({
  pending: fc.boolean(),
  result: fc.constantFrom<Unit>('a', 'b', 'n'),
  partial: fc.array(fc.constantFrom(clean('a'), clean('b'), double()), { maxLength: 2 }),
}), { minLength: n * (n - 1) / 2, maxLength: n * (n - 1) / 2 }).map((ms) => {
  let budget = cap
  const specs = pairs(ids(n)).map(([a, b], i): Spec => {
    const m = ms[i]!
    const pending = m.pending && budget > 0
    if (pending) budget--
    return { a, b, left: pending ? 1 : 0, fought: pending ? m.partial : [...m.partial, ...pointsUnit([m.result])] }
  })
  return { fighters: ids(n), topN, specs }
}))

function checkAgainst(ruleSet: RuleSet, fighters: string[], specs: Spec[], toEntries: (o: Unit[]) => EntryDraft[], key: (r: StandingRow) => number, exact: boolean) {
  const outlook = assessQualification(ruleSet, { fighters: fighters.map(id => ({ id })), matches: build(specs, null, toEntries), lotSeed: 'brute' })
  const seen = bruteForce(ruleSet, fighters, specs, toEntries, key)
  const complete = specs.every(s => s.left === 0)
  expect(outlook.complete).toBe(complete)
  fighters.forEach((id, i) => {
    const mine = outlook.fighters.find(f => f.fighterId === id)!
    const status = mine.topN!.status
    // Sound against the real ranking, lot included.
    if (status === 'secured') expect(seen.every(c => c.rankIn[i])).toBe(true)
    if (status === 'out') expect(seen.some(c => c.rankIn[i])).toBe(false)
    // Exact against the model with ties on the first tie-breaker left open.
    const secured = complete ? seen[0]!.rankIn[i]! : seen.every(c => c.surely[i])
    const out = complete ? !seen[0]!.rankIn[i]! : seen.every(c => !c.possibly[i])
    if (exact && mine.topN!.basis !== 'bounds') expect(status).toBe(secured ? 'secured' : out ? 'out' : 'reachable')
    else {
      if (status === 'secured') expect(secured).toBe(true)
      if (status === 'out') expect(out).toBe(true)
    }
    if (ruleSet.qualification.minSurvivalRate !== null) {
      const reaching = seen.filter(c => c.meets[i])
      const need = reaching.length === 0 ? null : Math.min(...reaching.map(c => c.extra[i]!))
      expect(mine.survival!.need).toBe(need)
      expect(mine.survival!.status).toBe(reaching.length === seen.length ? 'secured' : reaching.length === 0 ? 'out' : 'reachable')
    }
  })
}

describe('qualification against brute force', () => {
  it('first hit, unharmed bouts first: exact top-N status and minimal survival need', () => {
    fc.assert(fc.property(firstHitCase(7), ({ fighters, topN, rate, specs }) => {
      const ruleSet: RuleSet = { ...firstHitThreeBouts, qualification: { topN, minSurvivalRate: rate } }
      checkAgainst(ruleSet, fighters, specs, firstHitUnit, r => r.unharmedBouts, true)
    }), { numRuns: 60 })
  })

  it('points to seven, wins first: exact top-N status, a match at a time', () => {
    fc.assert(fc.property(pointsCase(6), ({ fighters, topN, specs }) => {
      const ruleSet: RuleSet = { ...pointsToSeven, qualification: { topN, minSurvivalRate: null } }
      checkAgainst(ruleSet, fighters, specs, pointsUnit, r => r.wins, true)
    }), { numRuns: 60 })
  })

  it('first hit, survival rate first: the bound method is never wrong when it decides', () => {
    fc.assert(fc.property(firstHitCase(6), ({ fighters, topN, rate, specs }) => {
      const ruleSet: RuleSet = { ...firstHitThreeBouts, ranking: ['survivalRate', 'pointsScored'], qualification: { topN, minSurvivalRate: rate } }
      checkAgainst(ruleSet, fighters, specs, firstHitUnit, r => r.survivalRate ?? -1, false)
    }), { numRuns: 40 })
  })
})
