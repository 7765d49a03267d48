import { describe, expect, it } from 'vitest'
import {
  PRESETS,
  firstHitThreeBouts,
  freezeRuleSet,
  parseRuleSet,
  pointsToSeven,
  presetCopy,
  ruleSetSchema,
} from '../../../shared/rules'

const problemsOf = (input: unknown) => {
  const parsed = parseRuleSet(input)
  return parsed.ok ? [] : parsed.problems
}

describe('rule sets', () => {
  it('ships the two presets, valid under the schema', () => {
    for (const preset of Object.values(PRESETS)) expect(ruleSetSchema.safeParse(preset).success).toBe(true)
    expect(firstHitThreeBouts).toMatchObject({
      name: 'First hit, three bouts',
      format: 'first-hit',
      boutsPerMatch: 3,
      ranking: ['unharmedBouts', 'pointsScored', 'pointsReceived', 'doubles', 'headToHead'],
    })
    expect(pointsToSeven).toMatchObject({
      name: 'Points to seven',
      format: 'points',
      pointsToWin: 7,
      timeLimitSeconds: 180,
      doubleOutLimit: 3,
      ranking: ['wins', 'indicator', 'pointsScored', 'doubles'],
    })
  })

  it('keeps the presets frozen and hands out editable copies', () => {
    expect(Object.isFrozen(firstHitThreeBouts)).toBe(true)
    expect(Object.isFrozen(firstHitThreeBouts.targets.head)).toBe(true)
    const copy = presetCopy('first-hit-three-bouts')
    copy.targets.head.cut = 5
    expect(firstHitThreeBouts.targets.head.cut).toBe(3)
  })

  it('fills the stated defaults: three bouts, top four, no rate cut, no double-out', () => {
    const { boutsPerMatch: _b, doubleOutLimit: _d, qualification: _q, ...rest } = presetCopy('first-hit-three-bouts')
    const parsed = ruleSetSchema.parse({ ...rest, qualification: {} })
    expect(parsed).toMatchObject({ boutsPerMatch: 3, doubleOutLimit: null, qualification: { topN: 4, minSurvivalRate: null } })
  })

  it('asks a points rule set for a points target, a time limit or both', () => {
    const { pointsToWin: _p, timeLimitSeconds: _t, ...rest } = presetCopy('points-to-seven')
    expect(problemsOf(rest)).toEqual([{ field: 'pointsToWin', message: 'pointsToWin or timeLimitSeconds: set at least one' }])
    expect(parseRuleSet({ ...rest, timeLimitSeconds: 120 }).ok).toBe(true)
    expect(parseRuleSet({ ...rest, pointsToWin: 5 }).ok).toBe(true)
  })

  it('names the field in every message', () => {
    const bad = { ...presetCopy('first-hit-three-bouts'), boutsPerMatch: 0, version: 1.5 }
    bad.targets.head.cut = -1
    expect(problemsOf(bad)).toEqual([
      { field: 'boutsPerMatch', message: 'boutsPerMatch: use at least 1' },
      { field: 'version', message: 'version: use a whole number' },
      { field: 'targets.head.cut', message: 'targets.head.cut: use at least 0' },
    ])
  })

  it('lists each tie-breaker at most once', () => {
    const input = { ...presetCopy('points-to-seven'), ranking: ['wins', 'indicator', 'wins'] }
    expect(problemsOf(input)).toEqual([{ field: 'ranking', message: 'ranking: list each tie-breaker once' }])
    expect(problemsOf({ ...input, ranking: ['wins', 'luck'] })[0]?.field).toBe('ranking.1')
  })

  it('asks for at least one qualification cut', () => {
    const input = { ...presetCopy('points-to-seven'), qualification: { topN: null, minSurvivalRate: null } }
    expect(problemsOf(input)).toEqual([{ field: 'qualification.topN', message: 'qualification: set topN, minSurvivalRate or both' }])
    expect(problemsOf({ ...input, qualification: { topN: null, minSurvivalRate: 1.5 } })[0]).toEqual({
      field: 'qualification.minSurvivalRate',
      message: 'qualification.minSurvivalRate: use a number from 0 to 1',
    })
  })

  it('takes the settings of each afterblow, double and ring-out mode', () => {
    const base = presetCopy('first-hit-three-bouts')
    const ok = (patch: object) => parseRuleSet({ ...base, ...patch }).ok
    expect(ok({ afterblow: { scoring: 'fixed', firstHitPoints: 2, afterblowPoints: 1 } })).toBe(true)
    expect(ok({ afterblow: { scoring: 'fixed' } })).toBe(false)
    expect(ok({ doubles: { scoring: 'penalty', penaltyPoints: 1 } })).toBe(true)
    expect(ok({ doubles: { scoring: 'penalty', penaltyPoints: 0 } })).toBe(false)
    expect(ok({ ringOut: { effect: 'points', points: 1 } })).toBe(true)
    expect(problemsOf({ ...base, ringOut: { effect: 'penalty' } })).toEqual([
      { field: 'ringOut.effect', message: 'ringOut.effect: choose none, warning or points' },
    ])
  })

  it('refuses unknown settings and a rule set with no target allowed', () => {
    expect(problemsOf({ ...presetCopy('first-hit-three-bouts'), luck: true })[0]?.message).toMatch(/luck/)
    const closed = presetCopy('first-hit-three-bouts')
    for (const t of Object.values(closed.targets)) t.allowed = false
    expect(problemsOf(closed)).toEqual([{ field: 'targets', message: 'targets: allow at least one target' }])
  })

  it('freezes a deep copy for a pool that has started, leaving the original editable', () => {
    const draft = presetCopy('points-to-seven')
    const frozen = freezeRuleSet(draft)
    draft.targets.hands.cut = 4
    expect(frozen.targets.hands.cut).toBe(1)
    expect(() => {
      (frozen.targets.hands as { cut: number }).cut = 9
    }).toThrow(TypeError)
    expect(frozen.version).toBe(1)
  })
})
