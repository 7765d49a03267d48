import { describe, expect, it } from 'vitest'
import { assessQualification, firstHitThreeBouts, pointsToSeven, survivalNeed } from '../../../shared/rules'
import type { FighterOutlook, Pool, QualificationOutlook, RuleSet } from '../../../shared/rules'
import { boundOutlook, countOutlook } from '../../../shared/rules/qualification'
import { clean, double, finished, log, rules, unfought } from './helpers'

const fighter = (outlook: QualificationOutlook, id: string): FighterOutlook => outlook.fighters.find(f => f.fighterId === id)!
const withCut = (ruleSet: RuleSet, topN: number | null, minSurvivalRate: number | null): RuleSet => ({ ...ruleSet, qualification: { topN, minSurvivalRate } })

describe('survival need', () => {
  it('is the fewest further unharmed bouts that reach the rate', () => {
    // 2 unharmed of 3, 3 to go, cut 50%: 6 bouts in all need 3 unharmed → 1 more (3/6 = 0.5; 2/6 fails).
    expect(survivalNeed(2, 3, 3, 0.5)).toBe(1)
    // already sure: 5 of 6 with 3 to go, 5/9 ≥ 0.5 even if every bout left is lost.
    expect(survivalNeed(5, 6, 3, 0.5)).toBe(0)
    // out of reach: 0 of 6 with 3 to go, at best 3/9 = 0.33.
    expect(survivalNeed(0, 6, 3, 0.5)).toBeNull()
    // the rule of thumb is about 50% (common practice, no source); at 2/3, 4 of 9 → 2 more of 3 (6/9).
    expect(survivalNeed(4, 6, 3, 2 / 3)).toBe(2)
  })
})

describe('top-N outlook', () => {
  // First hit, three bouts; top 2. Fighters Ada, Mara, Wren, Piers (invented).
  //   Ada–Mara: a, a, b → Ada 2, Mara 1.    Ada–Wren: a, a, b → Ada 2, Wren 1.
  //   Ada–Piers: a, b, b → Ada 1, Piers 2.  Mara–Piers: a, a, b → Mara 2, Piers 1.
  //   Wren–Piers: a, a, b → Wren 2, Piers 1.
  //   Mara–Wren: one double fenced, two bouts to go.
  // Unharmed now: Ada 5 (done), Piers 4 (done), Mara 3, Wren 3.
  const won = (x: 'a' | 'b', y: 'a' | 'b', z: 'a' | 'b') => log(clean(x), clean(y), clean(z))
  const live: Pool = {
    fighters: [{ id: 'ada' }, { id: 'mara' }, { id: 'wren' }, { id: 'piers' }],
    matches: [
      finished('m1', 'ada', 'mara', won('a', 'a', 'b')),
      finished('m2', 'ada', 'wren', won('a', 'a', 'b')),
      finished('m3', 'ada', 'piers', won('a', 'b', 'b')),
      finished('m4', 'mara', 'piers', won('a', 'a', 'b')),
      finished('m5', 'wren', 'piers', won('a', 'a', 'b')),
      unfought('m6', 'mara', 'wren', log(double())),
    ],
    lotSeed: 'pool-2',
  }
  const outlook = assessQualification(withCut(firstHitThreeBouts, 2, null), live)

  it('secures a fighter whom no completion can push out, counting bouts rivals fence against each other', () => {
    // Ada (5) is out of the top 2 only if two rivals reach 5. Piers is done at 4; Mara and Wren
    // each need 2 more but share only 2 bouts, so at most one gets there → secured.
    expect(fighter(outlook, 'ada').topN).toEqual({ status: 'secured', basis: 'exact' })
    // Taken alone each rival could reach 5, so the bound method cannot see it.
    expect(boundOutlook([5, 3, 3, 4], [5, 5, 5, 4], 2)[0]!.secured).toBe(false)
  })

  it('leaves reachable those with a completion either way', () => {
    // Piers 4 stays second if Mara–Wren ends in two doubles (3, 3); Mara at 5 would pass him.
    expect(['mara', 'wren', 'piers'].map(id => fighter(outlook, id).topN?.status)).toEqual(['reachable', 'reachable', 'reachable'])
    expect(fighter(outlook, 'mara')).toMatchObject({ remainingMatches: 1, remainingBouts: 2 })
  })

  it('counts the bouts fenced so far in a match under way', () => {
    // Mara 3 includes nothing from the double; 2 bouts left out of 3.
    expect(fighter(outlook, 'wren').remainingBouts).toBe(2)
    expect(outlook.complete).toBe(false)
  })

  it('puts a fighter out when enough rivals stay above even in the best case', () => {
    // counts [5, 5, 1], nothing left, top 2: the first two are in whatever happens, the third is out.
    expect(countOutlook([5, 5, 1], [], 2).map(v => [v.secured, v.out])).toEqual([[true, false], [true, false], [false, true]])
    // top 1: the two at 5 are level and later tie-breakers decide, so neither is secured nor out.
    expect(countOutlook([5, 5, 1], [], 1).map(v => [v.secured, v.out])).toEqual([[false, false], [false, false], [false, true]])
    // one unit left between the second and third: 1 + 1 = 2 still below 5 → the third is out of the top 2.
    expect(countOutlook([5, 5, 1], [[1, 2, 1]], 2)[2]!.out).toBe(true)
  })

  it('takes the final rank once everything is fenced', () => {
    const done: Pool = { ...live, matches: [...live.matches.slice(0, 5), finished('m6', 'mara', 'wren', log(double(), double(), double()))] }
    const final = assessQualification(withCut(firstHitThreeBouts, 2, null), done)
    expect(final.complete).toBe(true)
    // Three doubles leave Mara and Wren at 3 (level on every number; the lot orders them):
    // Ada 5, Piers 4 go through.
    expect(final.fighters.map(f => [f.fighterId, f.topN?.status, f.topN?.basis]).slice(0, 2)).toEqual([
      ['ada', 'secured', 'final'],
      ['piers', 'secured', 'final'],
    ])
    expect(final.fighters.slice(2).map(f => [f.topN?.status, f.topN?.basis])).toEqual([['out', 'final'], ['out', 'final']])
    expect(final.standings.lot.draws.map(d => d.fighterIds)).toEqual([['mara', 'wren']])
  })

  it('works on wins in the points format, a match at a time', () => {
    // Points to seven, top 1. Ada beat Mara (head ×3) and Wren; Mara–Wren to fence.
    // Ada 2 wins, done; Mara and Wren 0 with one match left → at most 1 < 2: Ada secured, both others out.
    const headTrio = log(clean('a', 'head'), clean('a', 'head'), clean('a', 'head'))
    const three: Pool = {
      fighters: [{ id: 'ada' }, { id: 'mara' }, { id: 'wren' }],
      matches: [finished('m1', 'ada', 'mara', headTrio), finished('m2', 'ada', 'wren', headTrio), unfought('m3', 'mara', 'wren')],
      lotSeed: 'p',
    }
    const result = assessQualification(withCut(pointsToSeven, 1, null), three)
    expect(result.fighters.map(f => [f.fighterId, f.topN?.status, f.remainingBouts])).toEqual([
      ['ada', 'secured', null],
      ['mara', 'out', null],
      ['wren', 'out', null],
    ])
  })

  it('says open when the first tie-breaker cannot be bounded', () => {
    const byPoints = assessQualification({ ...withCut(firstHitThreeBouts, 2, null), ranking: ['pointsScored'] }, live)
    expect(fighter(byPoints, 'ada').topN).toEqual({ status: 'reachable', basis: 'open' })
  })

  it('secures everyone when the pool is no bigger than the cut', () => {
    const all = assessQualification(withCut(firstHitThreeBouts, 4, null), live)
    expect(all.fighters.every(f => f.topN?.status === 'secured')).toBe(true)
  })
})

describe('survival-rate cut', () => {
  // Ada–Mara: a, b, double; Ada–Wren, Mara–Wren still to fence. Cut 50%, no top-N.
  // Ada: 1 unharmed of 3, 3 to go → 6 bouts need 3 unharmed → 2 more; Mara the same.
  // Wren: nothing fenced, 6 to go → 3 of 6.
  const pool: Pool = {
    fighters: [{ id: 'ada' }, { id: 'mara' }, { id: 'wren' }],
    matches: [finished('m1', 'ada', 'mara', log(clean('a'), clean('b'), double())), unfought('m2', 'ada', 'wren'), unfought('m3', 'mara', 'wren')],
    lotSeed: 'p',
  }
  const outlook = assessQualification(withCut(firstHitThreeBouts, null, 0.5), pool)

  it('gives each fighter the unharmed bouts still needed', () => {
    expect(outlook.fighters.map(f => [f.fighterId, f.remainingBouts, f.survival])).toEqual(expect.arrayContaining([
      ['ada', 3, { status: 'reachable', need: 2 }],
      ['mara', 3, { status: 'reachable', need: 2 }],
      ['wren', 6, { status: 'reachable', need: 3 }],
    ]))
    expect(fighter(outlook, 'ada').topN).toBeNull()
  })

  it('combines both cuts: secured only if both are, out if either is', () => {
    const both = assessQualification(withCut(firstHitThreeBouts, 3, 0.5), pool)
    // top 3 of 3 is secured for all; the rate is still open → reachable.
    expect(both.fighters.map(f => f.status)).toEqual(['reachable', 'reachable', 'reachable'])
    const high = assessQualification(withCut(firstHitThreeBouts, 3, 0.9), pool)
    // Ada at best 4 of 6 = 0.67 < 0.9 → out on the rate, so out overall.
    expect(fighter(high, 'ada')).toMatchObject({ survival: { status: 'out', need: null }, status: 'out' })
  })

  it('leaves the need open in the points format, where the number of exchanges is not fixed', () => {
    const open = assessQualification(withCut(rules('points-to-seven'), null, 0.5), pool)
    expect(fighter(open, 'wren')).toMatchObject({ remainingBouts: null, survival: { status: 'reachable', need: null } })
  })

  it('puts withdrawn and expelled fighters out', () => {
    const gone = assessQualification(withCut(firstHitThreeBouts, 2, 0.5), { ...pool, fighters: [{ id: 'ada', withdrawn: true }, { id: 'mara' }, { id: 'wren' }] })
    expect(fighter(gone, 'ada')).toMatchObject({ active: false, status: 'out', topN: { status: 'out' }, survival: { status: 'out', need: null } })
    // With Ada's matches annulled, two fighters remain for a top 2: both secured on that cut.
    expect(fighter(gone, 'mara').topN?.status).toBe('secured')
  })
})
