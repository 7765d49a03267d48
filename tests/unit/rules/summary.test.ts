import { describe, expect, it } from 'vitest'
import { SAFETY_CAUTIONS, describeRules, firstHitThreeBouts, pointsToSeven } from '../../../shared/rules'
import type { RuleSummary } from '../../../shared/rules'
import { rules } from './helpers'

const section = (summary: RuleSummary, id: string) => summary.sections.find(s => s.id === id)!.sentences

describe('plain-language summary', () => {
  const firstHit = describeRules(firstHitThreeBouts)
  const points = describeRules(pointsToSeven)

  it('has the sections of the briefing in order, headed by the rule set\'s name and version', () => {
    expect(firstHit.sections.map(s => s.id)).toEqual(['format', 'bout', 'targets', 'afterblow', 'doubles', 'cards', 'ringOut', 'ranking', 'qualification', 'safety'])
    expect([firstHit.title, firstHit.version]).toEqual(['First hit, three bouts', 1])
  })

  it('describes the first-hit format, its bouts and unharmed bouts', () => {
    expect(section(firstHit, 'format')).toContain('A match is 3 bouts.')
    expect(section(firstHit, 'bout')).toEqual([
      'A bout runs from the director\'s call to fence until the director calls halt.',
      'If the judges did not see the hit, or no hit was valid, the bout is fenced again and counts for nothing.',
      'A bout in which you are not validly hit is an unharmed bout; an afterblow or a double leaves both fighters hit.',
    ])
  })

  it('describes the points format with its points and time limit', () => {
    expect(section(points, 'format')).toContain('A match ends when a fighter reaches 7 points or after 3 minutes of fencing, whichever comes first.')
    expect(section(points, 'bout')[0]).toBe('An exchange runs from the director\'s call to fence until the director calls halt.')
    const timed = describeRules(rules('points-to-seven', { pointsToWin: null, timeLimitSeconds: 150 }))
    expect(section(timed, 'format')).toContain('A match ends after 2 minutes 30 seconds of fencing.')
  })

  it('lists the targets with their values and the ones not allowed', () => {
    expect(section(firstHit, 'targets')).toEqual([
      'Head: 3 points, cut or thrust.',
      'Torso: 2 points, cut or thrust.',
      'Arms: 1 point, cut or thrust.',
      'Hands: 1 point, cut or thrust.',
      'Legs: 1 point, cut or thrust.',
    ])
    const targets = { ...firstHitThreeBouts.targets, torso: { allowed: true, cut: 2, thrust: 3 }, hands: { allowed: false, cut: 0, thrust: 0 }, legs: { allowed: false, cut: 0, thrust: 0 } }
    const narrow = section(describeRules(rules('first-hit-three-bouts', { targets })), 'targets')
    expect(narrow).toContain('Torso: 2 points for a cut, 3 points for a thrust.')
    expect(narrow).toContain('Not allowed: hands and legs. A hit there does not count.')
  })

  it('explains each afterblow mode', () => {
    expect(section(firstHit, 'afterblow')).toContain('Both hits score in full.')
    expect(section(points, 'afterblow')).toContain('The lower value is taken from the higher, and the fighter whose hit was worth more scores the difference; equal hits score nothing.')
    const fixed = describeRules(rules('first-hit-three-bouts', { afterblow: { scoring: 'fixed', firstHitPoints: 2, afterblowPoints: 1 } }))
    expect(section(fixed, 'afterblow')).toContain('The first hit scores 2 points and the afterblow 1 point.')
  })

  it('explains doubles and the double-out', () => {
    expect(section(firstHit, 'doubles')).toEqual(['A double is both fighters hitting at the same time.', 'A double scores nothing.', 'There is no limit on doubles.'])
    expect(section(points, 'doubles')).toContain('At the 3rd double of a match both fighters lose the match.')
    const penalty = describeRules(rules('points-to-seven', { doubles: { scoring: 'penalty', penaltyPoints: 1 } }))
    expect(section(penalty, 'doubles')).toContain('A double takes 1 point from each fighter.')
    expect(section(describeRules(rules('points-to-seven', { doubles: { scoring: 'both' } })), 'doubles')).toContain('Each fighter scores their own hit.')
  })

  it('explains cards and leaving the ring', () => {
    expect(section(points, 'cards')).toEqual([
      'A warning is recorded and changes no score.',
      'A yellow card is recorded; a second yellow in the same match counts as a red.',
      'A red card gives the opponent 1 point.',
      'A black card expels the fighter: the match is lost and every match still to fence is forfeited.',
    ])
    expect(section(firstHit, 'ringOut')).toContain('The fighter who left gets a warning.')
    expect(section(points, 'ringOut')).toContain('The opponent scores 1 point.')
  })

  it('gives the ranking order, the lot and what a withdrawal does', () => {
    expect(section(firstHit, 'ranking')).toEqual([
      'Fighters are ranked in this order:',
      '1. Unharmed bouts, most first.',
      '2. Points scored, most first.',
      '3. Points received, fewest first.',
      '4. Doubles, fewest first.',
      '5. Head-to-head: wins in the matches among the fighters still level.',
      'Fighters still level after that are separated by a drawn lot, recorded with the results.',
      'If a fighter withdraws, all their matches are removed from the pool table.',
      'An expelled fighter\'s fenced matches stand and the rest count as forfeits.',
    ])
    expect(section(points, 'ranking')).toContain('If a fighter withdraws, the matches they fenced stand and the rest count as forfeits.')
  })

  it('states the qualification cut', () => {
    expect(section(firstHit, 'qualification')).toEqual(['The top 4 of the pool go on.'])
    const both = describeRules({ ...firstHitThreeBouts, qualification: { topN: 4, minSurvivalRate: 0.5 } })
    expect(section(both, 'qualification')).toEqual(['The top 4 of the pool go on, if they also have a survival rate of at least 50%.'])
    const rateOnly = describeRules({ ...firstHitThreeBouts, qualification: { topN: null, minSurvivalRate: 2 / 3 } })
    expect(section(rateOnly, 'qualification')).toEqual(['Every fighter with a survival rate of at least 66.7% goes on.'])
  })

  it('carries every safety caution (common practice; EN 13567 defines the protection levels)', () => {
    const text = section(firstHit, 'safety').join(' ')
    expect(section(points, 'safety')).toEqual([...SAFETY_CAUTIONS])
    for (const phrase of [
      'fencing mask rated 1600 N with back-of-head protection',
      'rigid gorget',
      'jacket rated 350 N, or 800 N where the event asks',
      'heavy gloves',
      'rigid elbow, knee and shin guards',
      'groin protection',
      'no bare skin',
      'flex-checked',
      'tip blunted and covered',
      'If a tip cover comes off, the bout halts and the blade is inspected again.',
      'Anyone may call halt.',
      'suspected concussion means withdrawal',
      'First aid is on site and the emergency number is posted.',
      'defer to the event\'s rules, local law and the qualified officials',
    ]) expect(text).toContain(phrase)
  })

  it('keeps every sentence short', () => {
    for (const s of [...firstHit.sections, ...points.sections].flatMap(x => x.sentences)) expect(s.split(' ').length).toBeLessThanOrEqual(24)
  })
})
