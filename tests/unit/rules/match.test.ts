import { describe, expect, it } from 'vitest'
import { checkEntry, deriveMatch, firstHitThreeBouts, matchEntrySchema, pointsToSeven, previewEntry } from '../../../shared/rules'
import { afterblow, cancel, card, clean, concede, double, log, ringOut, rules, timeUp, voided } from './helpers'

// Preset target values used throughout: head 3, torso 2, arms 1, hands 1, legs 1 (cut or thrust).

const score = (state: ReturnType<typeof deriveMatch>) => [state.sides.a.points, state.sides.b.points]

describe('entries', () => {
  it('parses each kind of entry and names the field that is wrong', () => {
    expect(matchEntrySchema.parse({ kind: 'clean', id: 'e1', side: 'a', target: 'head', action: 'cut', at: '2026-09-12T10:15:00Z' }).kind).toBe('clean')
    const bad = matchEntrySchema.safeParse({ kind: 'afterblow', id: 'e2', side: 'b', target: 'torso', action: 'cut', afterblow: { target: 'neck', action: 'cut' } })
    expect(bad.error?.issues.map(i => [i.path.join('.'), i.message])).toEqual([
      ['afterblow.target', 'target: choose head, torso, arms, hands, legs'],
    ])
    expect(matchEntrySchema.safeParse({ kind: 'undo', id: 'e3' }).success).toBe(false)
    expect(matchEntrySchema.safeParse({ kind: 'cancel', id: 'e4', targetId: 'e1', at: 'tuesday' }).error?.issues[0]?.path).toEqual(['at'])
  })

  it('refuses a target the rule set does not allow, naming the field', () => {
    const noHands = rules('first-hit-three-bouts', { targets: { ...firstHitThreeBouts.targets, hands: { allowed: false, cut: 0, thrust: 0 } } })
    const [entry] = log(afterblow('a', ['torso', 'cut'], ['hands', 'cut']))
    expect(checkEntry(noHands, entry!)).toEqual([
      { field: 'afterblow.target', message: 'afterblow.target: hands is not an allowed target in this rule set' },
    ])
    const [two] = log(double(['hands', 'thrust'], ['head', 'cut']))
    expect(checkEntry(noHands, two!).map(p => p.field)).toEqual(['a.target'])
  })

  it('refuses time called in a format without a time limit', () => {
    const [entry] = log(timeUp())
    expect(checkEntry(firstHitThreeBouts, entry!)).toEqual([{ field: 'kind', message: 'kind: time-up needs a points rule set with a time limit' }])
    expect(checkEntry(pointsToSeven, entry!)).toEqual([])
  })
})

describe('first-hit scoring', () => {
  it('counts three clean bouts and the unharmed bouts of each side', () => {
    // a head 3, b torso 2, a arms 1 → 4–2; a unharmed in bouts 1 and 3, b in bout 2.
    const state = deriveMatch(firstHitThreeBouts, log(clean('a', 'head'), clean('b', 'torso', 'thrust'), clean('a', 'arms')))
    expect(score(state)).toEqual([4, 2])
    expect(state.bouts).toBe(3)
    expect([state.sides.a.unharmedBouts, state.sides.a.hitBouts]).toEqual([2, 1])
    expect([state.sides.b.unharmedBouts, state.sides.b.hitBouts]).toEqual([1, 2])
    expect(state).toMatchObject({ finished: true, endReason: 'bouts', result: 'a' })
    expect(state.timeline.map(t => t.ended)).toEqual([null, null, 'bouts'])
  })

  it('leaves both fighters harmed by an afterblow (common practice, no source)', () => {
    const state = deriveMatch(firstHitThreeBouts, log(afterblow('a', ['head', 'cut'], ['arms', 'cut'])))
    expect(state.sides.a.unharmedBouts).toBe(0)
    expect(state.sides.b.unharmedBouts).toBe(0)
    expect(state.timeline[0]!.hit).toEqual({ a: true, b: true })
  })

  it('does not count a void bout: it is fenced again and stays in the record', () => {
    // clean, void (not seen), clean, void (no valid hit), clean → 3 bouts counted, 2 voids; ends on the 5th entry.
    const state = deriveMatch(firstHitThreeBouts, log(clean('a'), voided('not-seen'), clean('b'), voided('no-valid-hit'), clean('a')))
    expect([state.bouts, state.voids]).toEqual([3, 2])
    expect(state.timeline.map(t => t.bout)).toEqual([1, null, 2, null, 3])
    expect(state.timeline.every(t => t.status === 'applied')).toBe(true)
    expect(state.endReason).toBe('bouts')
  })

  it('can end in a draw', () => {
    // a torso 2, b torso 2, then a double that scores nothing under the preset → 2–2.
    const state = deriveMatch(firstHitThreeBouts, log(clean('a'), clean('b'), double()))
    expect(score(state)).toEqual([2, 2])
    expect(state).toMatchObject({ finished: true, result: 'draw', leader: null })
  })

  it('ends when the set number of bouts is reached', () => {
    const five = rules('first-hit-three-bouts', { boutsPerMatch: 5 })
    const three = log(clean('a'), clean('a'), clean('a'))
    expect(deriveMatch(five, three).finished).toBe(false)
    expect(deriveMatch(five, [...three, ...log({ ...clean('b'), id: 'e4' }, { ...clean('b'), id: 'e5' })]).finished).toBe(true)
  })
})

describe('afterblow modes', () => {
  const hit = afterblow('a', ['torso', 'cut'], ['head', 'thrust'])
  it('full: both hits count in full', () => {
    // a torso 2, b's afterblow to the head 3 → 2–3.
    expect(score(deriveMatch(firstHitThreeBouts, log(hit)))).toEqual([2, 3])
  })

  it('difference: the lower value is taken from the higher and the bigger hit scores the rest', () => {
    const difference = rules('first-hit-three-bouts', { afterblow: { scoring: 'difference' } })
    // head 3 first, arms 1 back → 3 − 1 = 2 to a.
    expect(score(deriveMatch(difference, log(afterblow('a', ['head', 'cut'], ['arms', 'cut']))))).toEqual([2, 0])
    // torso 2 first, head 3 back → 3 − 2 = 1 to b, whose afterblow was worth more.
    expect(score(deriveMatch(difference, log(hit)))).toEqual([0, 1])
    // equal values → 0 each, and both fighters were hit.
    const level = deriveMatch(difference, log(afterblow('b', ['legs', 'cut'], ['arms', 'thrust'])))
    expect(score(level)).toEqual([0, 0])
    expect(level.timeline[0]!.hit).toEqual({ a: true, b: true })
  })

  it('fixed: set points for the first hit and for the afterblow', () => {
    const fixed = rules('first-hit-three-bouts', { afterblow: { scoring: 'fixed', firstHitPoints: 2, afterblowPoints: 1 } })
    // whatever the targets: 2 to the first hitter (a), 1 to the answer (b).
    expect(score(deriveMatch(fixed, log(hit)))).toEqual([2, 1])
  })

  it('counts afterblows landed and received', () => {
    const state = deriveMatch(firstHitThreeBouts, log(hit, afterblow('b', ['arms', 'cut'], ['legs', 'cut'])))
    expect([state.sides.a.afterblowsReceived, state.sides.a.afterblowsLanded]).toEqual([1, 1])
    expect([state.sides.b.afterblowsReceived, state.sides.b.afterblowsLanded]).toEqual([1, 1])
  })
})

describe('double modes', () => {
  const two = double(['head', 'cut'], ['legs', 'thrust'])
  it('both: each scores their own hit', () => {
    // a's head 3, b's legs 1 → 3–1.
    expect(score(deriveMatch(rules('first-hit-three-bouts', { doubles: { scoring: 'both' } }), log(two)))).toEqual([3, 1])
  })

  it('none: a double scores nothing but is counted and leaves both hit', () => {
    const state = deriveMatch(firstHitThreeBouts, log(two))
    expect(score(state)).toEqual([0, 0])
    expect(state.doubles).toBe(1)
    expect([state.sides.a.hitBouts, state.sides.b.hitBouts]).toEqual([1, 1])
  })

  it('penalty: points are taken from both', () => {
    const penalty = rules('first-hit-three-bouts', { doubles: { scoring: 'penalty', penaltyPoints: 1 } })
    // a torso 2, then a double → 2 − 1 = 1 for a and 0 − 1 = −1 for b.
    expect(score(deriveMatch(penalty, log(clean('a'), two)))).toEqual([1, -1])
  })

  it('double-out: at the third double both fighters lose, and later entries are ignored', () => {
    // points preset, limit 3: a head 3, then three doubles → finished at the 4th entry, a leading 3–0 but both lose.
    const state = deriveMatch(pointsToSeven, log(clean('a', 'head'), two, two, two, clean('a', 'head')))
    expect(state).toMatchObject({ finished: true, endReason: 'double-out', result: 'both-lose', doubles: 3 })
    expect(state.timeline[3]!.ended).toBe('double-out')
    expect(state.timeline[4]).toMatchObject({ status: 'ignored', reason: 'after-end' })
    expect(score(state)).toEqual([3, 0])
  })

  it('double-out wins over the bout count when both come at once', () => {
    const state = deriveMatch(rules('first-hit-three-bouts', { doubleOutLimit: 3 }), log(double(), double(), double()))
    expect(state).toMatchObject({ endReason: 'double-out', result: 'both-lose' })
  })
})

describe('cards', () => {
  it('records a warning and changes no score', () => {
    const state = deriveMatch(pointsToSeven, log(card('a', 'warning')))
    expect(state.sides.a.cards).toMatchObject({ warnings: 1, reds: 0 })
    expect(score(state)).toEqual([0, 0])
  })

  it('turns the second yellow into a red: the opponent gets the red points', () => {
    // preset red = 1 point to the opponent. Yellow, yellow → b gets 1 at the second.
    const state = deriveMatch(pointsToSeven, log(card('a', 'yellow'), card('a', 'yellow')))
    expect(state.sides.a.cards).toMatchObject({ yellows: 2, reds: 1 })
    expect(state.timeline.map(t => t.card?.effect)).toEqual(['recorded', 'red'])
    expect(score(state)).toEqual([0, 1])
  })

  it('gives the opponent the red points for a red card, and can end a points match with them', () => {
    const redThree = rules('points-to-seven', { cards: { redPoints: 3 } })
    // b has 6 (head, head), a's red gives b 3 more → 9 ≥ 7, b wins on points.
    const state = deriveMatch(redThree, log(clean('b', 'head'), clean('b', 'head'), card('a', 'red')))
    expect(score(state)).toEqual([0, 9])
    expect(state).toMatchObject({ endReason: 'points', result: 'b' })
  })

  it('ends the match with a black card: the expelled side loses', () => {
    const state = deriveMatch(firstHitThreeBouts, log(clean('a', 'head'), card('a', 'black'), clean('b')))
    expect(state).toMatchObject({ finished: true, endReason: 'expelled', result: 'b' })
    expect(state.sides.a.cards.black).toBe(true)
    expect(state.timeline[2]).toMatchObject({ status: 'ignored', reason: 'after-end' })
  })

  it('records a card given after the end without changing the score', () => {
    const state = deriveMatch(firstHitThreeBouts, log(clean('a'), clean('a'), clean('a'), card('b', 'black')))
    expect(state).toMatchObject({ endReason: 'bouts', result: 'a' })
    expect(state.sides.b.cards.black).toBe(true)
    expect(state.timeline[3]).toMatchObject({ status: 'applied', afterEnd: true, points: { a: 0, b: 0 } })
  })
})

describe('ring-out', () => {
  it('none: recorded only', () => {
    const state = deriveMatch(rules('points-to-seven', { ringOut: { effect: 'none' } }), log(ringOut('a')))
    expect([state.sides.a.ringOuts, ...score(state), state.sides.a.cards.warnings]).toEqual([1, 0, 0, 0])
  })

  it('warning: the fighter who left gets a warning', () => {
    const state = deriveMatch(firstHitThreeBouts, log(ringOut('b')))
    expect(state.sides.b.cards).toMatchObject({ warnings: 1, list: [{ entryId: 'e1', colour: 'warning', fromRingOut: true }] })
  })

  it('points: the opponent scores', () => {
    // preset: 1 point to the opponent. b leaves twice → a 2.
    expect(score(deriveMatch(pointsToSeven, log(ringOut('b'), ringOut('b'))))).toEqual([2, 0])
  })
})

describe('points format', () => {
  it('ends when a fighter reaches the points to win', () => {
    // a: head 3, head 3 (6), b: torso 2, a: arms 1 → 7–2.
    const state = deriveMatch(pointsToSeven, log(clean('a', 'head'), clean('a', 'head'), clean('b'), clean('a', 'arms')))
    expect(score(state)).toEqual([7, 2])
    expect(state).toMatchObject({ finished: true, endReason: 'points', result: 'a', bouts: 4 })
  })

  it('ends when time is called: the leader wins, level scores draw', () => {
    expect(deriveMatch(pointsToSeven, log(clean('b'), timeUp()))).toMatchObject({ endReason: 'time', result: 'b' })
    expect(deriveMatch(pointsToSeven, log(clean('b'), clean('a'), timeUp()))).toMatchObject({ endReason: 'time', result: 'draw' })
  })

  it('ends when a fighter concedes: the other wins by forfeit', () => {
    const state = deriveMatch(pointsToSeven, log(clean('a', 'head'), concede('a')))
    expect(state).toMatchObject({ endReason: 'forfeit', result: 'b' })
  })
})

describe('the log', () => {
  it('takes back a cancelled entry as if it had never counted, and keeps it in the record', () => {
    // a head 3, b torso 2 (cancelled), a arms 1 → 4–0.
    const state = deriveMatch(pointsToSeven, log(clean('a', 'head'), clean('b'), cancel('e2'), clean('a', 'arms')))
    expect(score(state)).toEqual([4, 0])
    expect(state.timeline.map(t => t.status)).toEqual(['applied', 'cancelled', 'applied', 'applied'])
    expect(state.timeline[1]!.cancelledBy).toBe('e3')
    expect(state.timeline[2]!.cancels).toBe('e2')
    expect(state.timeline[3]!.bout).toBe(2)
  })

  it('puts an entry back when its cancel is cancelled', () => {
    const state = deriveMatch(pointsToSeven, log(clean('b'), cancel('e1'), cancel('e2')))
    expect(score(state)).toEqual([0, 2])
    expect(state.timeline.map(t => t.status)).toEqual(['applied', 'cancelled', 'applied'])
  })

  it('reopens a match when the entry that ended it is cancelled', () => {
    // Three clean bouts end it; a fourth is ignored; cancelling the third lets the fourth count as bout 3.
    const entries = log(clean('a'), clean('a'), clean('a'), clean('b', 'head'))
    const before = deriveMatch(firstHitThreeBouts, entries)
    expect(before.timeline[3]).toMatchObject({ status: 'ignored', reason: 'after-end' })
    const after = deriveMatch(firstHitThreeBouts, [...entries, ...log({ ...cancel('e3'), id: 'e5' })])
    expect(after.timeline[3]).toMatchObject({ status: 'applied', bout: 3, ended: 'bouts' })
    expect(score(after)).toEqual([4, 3])
  })

  it('ignores a cancel naming no earlier entry', () => {
    const state = deriveMatch(pointsToSeven, log(cancel('e9'), clean('a')))
    expect(state.timeline[0]).toMatchObject({ status: 'ignored', reason: 'unknown-target' })
    expect(score(state)).toEqual([2, 0])
  })

  it('counts an entry sent twice once', () => {
    const [first] = log(clean('a', 'head'))
    const state = deriveMatch(pointsToSeven, [first!, first!])
    expect(score(state)).toEqual([3, 0])
    expect(state.timeline[1]).toMatchObject({ status: 'ignored', reason: 'duplicate' })
  })

  it('keeps an entry the rule set refuses as rejected, with the problem', () => {
    const noLegs = rules('points-to-seven', { targets: { ...pointsToSeven.targets, legs: { allowed: false, cut: 0, thrust: 0 } } })
    const state = deriveMatch(noLegs, log(clean('a', 'legs'), clean('b')))
    expect(state.timeline[0]).toMatchObject({ status: 'rejected', problems: [{ field: 'target' }] })
    expect([state.bouts, ...score(state)]).toEqual([1, 0, 2])
  })

  it('shows the running score on every line of the strip', () => {
    // head 3 to a, torso 2 to b, a yellow to b (recorded), arms 1 to a → 3–0, 3–2, 3–2, 4–2.
    const state = deriveMatch(pointsToSeven, log(clean('a', 'head'), clean('b'), card('b', 'yellow'), clean('a', 'arms')))
    expect(state.timeline.map(t => [t.score.a, t.score.b])).toEqual([[3, 0], [3, 2], [3, 2], [4, 2]])
    expect(state.leader).toBe('a')
  })

  it('derives an empty log as a match not yet started', () => {
    expect(deriveMatch(firstHitThreeBouts, [])).toMatchObject({ bouts: 0, finished: false, result: null, leader: null, timeline: [] })
  })

  it('previews what an entry would do before it joins the log', () => {
    const entries = log(clean('a', 'head'), clean('a', 'head'))
    // 6–0 now; a torso cut to a makes 8 ≥ 7 and ends the match.
    const next = log({ ...clean('a'), id: 'e3' })[0]!
    expect(previewEntry(pointsToSeven, entries, next).item).toMatchObject({ status: 'applied', points: { a: 2, b: 0 }, ended: 'points' })
    const late = [...entries, next]
    expect(previewEntry(pointsToSeven, late, log({ ...clean('b'), id: 'e4' })[0]!).item).toMatchObject({ status: 'ignored', reason: 'after-end' })
    expect(previewEntry(pointsToSeven, entries, log({ ...clean('b'), id: 'e1' })[0]!).item).toMatchObject({ status: 'ignored', reason: 'duplicate' })
    expect(entries).toHaveLength(2)
  })
})
