import type { RuleSet, Target, TieBreaker } from './ruleset'
import { TARGETS } from './ruleset'

export type SummarySectionId = 'format' | 'bout' | 'targets' | 'afterblow' | 'doubles' | 'cards' | 'ringOut' | 'ranking' | 'qualification' | 'safety'

export interface SummarySection {
  id: SummarySectionId
  heading: string
  sentences: string[]
}

export interface RuleSummary {
  title: string
  version: number
  sections: SummarySection[]
}

// The minimum kit and conduct commonly demanded at HEMA events (common practice; EN 13567 defines
// the protection levels, the newton figures are the usual ones, no single source).
export const SAFETY_CAUTIONS: readonly string[] = [
  'Wear a fencing mask rated 1600 N with back-of-head protection and a rigid gorget.',
  'Wear a jacket rated 350 N, or 800 N where the event asks for it.',
  'Wear heavy gloves, rigid elbow, knee and shin guards, and groin protection; leave no bare skin.',
  'Every blade is flex-checked, with the tip blunted and covered.',
  'If a tip cover comes off, the bout halts and the blade is inspected again.',
  'Anyone may call halt.',
  'A suspected concussion means withdrawal from the event.',
  'First aid is on site and the emergency number is posted.',
  'Always defer to the event\'s rules, local law and the qualified officials.',
]

const TARGET_NAMES: Record<Target, string> = {
  head: 'Head',
  torso: 'Torso',
  arms: 'Arms',
  hands: 'Hands',
  legs: 'Legs',
}

const TIE_BREAKER_WORDS: Record<TieBreaker, string> = {
  unharmedBouts: 'Unharmed bouts, most first',
  survivalRate: 'Survival rate (unharmed bouts ÷ bouts fought), highest first',
  wins: 'Wins, most first',
  indicator: 'Indicator (points scored minus points received), highest first',
  pointsScored: 'Points scored, most first',
  pointsReceived: 'Points received, fewest first',
  doubles: 'Doubles, fewest first',
  headToHead: 'Head-to-head: wins in the matches among the fighters still level',
}

function points(n: number): string {
  return n === 1 ? '1 point' : `${n} points`
}

function ordinal(n: number): string {
  const tens = n % 100
  const suffix = tens >= 11 && tens <= 13 ? 'th' : ['th', 'st', 'nd', 'rd'][n % 10] ?? 'th'
  return `${n}${suffix}`
}

function duration(seconds: number): string {
  const minutes = Math.floor(seconds / 60)
  const rest = seconds % 60
  const m = minutes === 1 ? '1 minute' : `${minutes} minutes`
  const s = rest === 1 ? '1 second' : `${rest} seconds`
  if (minutes === 0) return s
  return rest === 0 ? m : `${m} ${s}`
}

function percent(rate: number): string {
  return `${Number((rate * 100).toFixed(1))}%`
}

function listWords(words: string[]): string {
  if (words.length <= 1) return words.join('')
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`
}

function formatSection(ruleSet: RuleSet): string[] {
  if (ruleSet.format === 'first-hit') {
    return [
      'First-hit format: each bout ends at the first valid hit.',
      `A match is ${ruleSet.boutsPerMatch === 1 ? '1 bout' : `${ruleSet.boutsPerMatch} bouts`}.`,
      'The fighter with more points after the last bout wins the match; equal points make a draw.',
    ]
  }
  const ends = ruleSet.pointsToWin !== null && ruleSet.timeLimitSeconds !== null
    ? `A match ends when a fighter reaches ${points(ruleSet.pointsToWin)} or after ${duration(ruleSet.timeLimitSeconds)} of fencing, whichever comes first.`
    : ruleSet.pointsToWin !== null
      ? `A match ends when a fighter reaches ${points(ruleSet.pointsToWin)}.`
      : `A match ends after ${duration(ruleSet.timeLimitSeconds ?? 0)} of fencing.`
  return [
    'Points format: a match is fenced exchange by exchange.',
    ends,
    'More points wins the match; equal points at the end make a draw.',
  ]
}

function boutWord(ruleSet: RuleSet): 'bout' | 'exchange' {
  return ruleSet.format === 'first-hit' ? 'bout' : 'exchange'
}

function boutSection(ruleSet: RuleSet): string[] {
  const unit = boutWord(ruleSet)
  const sentences = [
    `${unit === 'bout' ? 'A' : 'An'} ${unit} runs from the director's call to fence until the director calls halt.`,
    `If the judges did not see the hit, or no hit was valid, the ${unit} is fenced again and counts for nothing.`,
  ]
  if (ruleSet.format === 'first-hit') {
    sentences.push('A bout in which you are not validly hit is an unharmed bout; an afterblow or a double leaves both fighters hit.')
  }
  return sentences
}

function targetsSection(ruleSet: RuleSet): string[] {
  const sentences: string[] = []
  const barred: string[] = []
  for (const target of TARGETS) {
    const value = ruleSet.targets[target]
    if (!value.allowed) {
      barred.push(TARGET_NAMES[target].toLowerCase())
      continue
    }
    sentences.push(value.cut === value.thrust
      ? `${TARGET_NAMES[target]}: ${points(value.cut)}, cut or thrust.`
      : `${TARGET_NAMES[target]}: ${points(value.cut)} for a cut, ${points(value.thrust)} for a thrust.`)
  }
  if (barred.length > 0) sentences.push(`Not allowed: ${listWords(barred)}. A hit there does not count.`)
  return sentences
}

function afterblowSection(ruleSet: RuleSet): string[] {
  const rule = ruleSet.afterblow
  const scoring = rule.scoring === 'full'
    ? 'Both hits score in full.'
    : rule.scoring === 'difference'
      ? 'The lower value is taken from the higher, and the fighter whose hit was worth more scores the difference; equal hits score nothing.'
      : `The first hit scores ${points(rule.firstHitPoints)} and the afterblow ${points(rule.afterblowPoints)}.`
  return [
    'Once a hit lands, the fighter who was hit may strike back with one action, taking at most one step: the afterblow.',
    scoring,
    `An afterblow leaves both fighters hit for that ${boutWord(ruleSet)}.`,
  ]
}

function doublesSection(ruleSet: RuleSet): string[] {
  const rule = ruleSet.doubles
  const scoring = rule.scoring === 'both'
    ? 'Each fighter scores their own hit.'
    : rule.scoring === 'none'
      ? 'A double scores nothing.'
      : `A double takes ${points(rule.penaltyPoints)} from each fighter.`
  return [
    'A double is both fighters hitting at the same time.',
    scoring,
    ruleSet.doubleOutLimit === null
      ? 'There is no limit on doubles.'
      : `At the ${ordinal(ruleSet.doubleOutLimit)} double of a match both fighters lose the match.`,
  ]
}

function cardsSection(ruleSet: RuleSet): string[] {
  return [
    'A warning is recorded and changes no score.',
    'A yellow card is recorded; a second yellow in the same match counts as a red.',
    ruleSet.cards.redPoints > 0
      ? `A red card gives the opponent ${points(ruleSet.cards.redPoints)}.`
      : 'A red card is recorded and changes no score.',
    'A black card expels the fighter: the match is lost and every match still to fence is forfeited.',
  ]
}

function ringOutSection(ruleSet: RuleSet): string[] {
  const rule = ruleSet.ringOut
  return [
    'Leaving the ring halts the fencing and both fighters reset.',
    rule.effect === 'none'
      ? 'It has no other effect.'
      : rule.effect === 'warning'
        ? 'The fighter who left gets a warning.'
        : `The opponent scores ${points(rule.points)}.`,
  ]
}

function rankingSection(ruleSet: RuleSet): string[] {
  const order = ruleSet.ranking.map((t, i) => `${i + 1}. ${TIE_BREAKER_WORDS[t]}.`)
  return [
    ...(order.length > 0
      ? ['Fighters are ranked in this order:', ...order, 'Fighters still level after that are separated by a drawn lot, recorded with the results.']
      : ['Fighters are ranked by a drawn lot, recorded with the results.']),
    ruleSet.withdrawn === 'forfeit-remaining'
      ? 'If a fighter withdraws, the matches they fenced stand and the rest count as forfeits.'
      : 'If a fighter withdraws, all their matches are removed from the pool table.',
    'An expelled fighter\'s fenced matches stand and the rest count as forfeits.',
  ]
}

function qualificationSection(ruleSet: RuleSet): string[] {
  const { topN, minSurvivalRate } = ruleSet.qualification
  const rate = minSurvivalRate === null ? null : `a survival rate of at least ${percent(minSurvivalRate)}`
  if (topN !== null && rate !== null) return [`The top ${topN} of the pool go on, if they also have ${rate}.`]
  if (topN !== null) return [`The top ${topN} of the pool go on.`]
  return [`Every fighter with ${rate} goes on.`]
}

/** The rules in short sentences, for the fighters' briefing and the public page. */
export function describeRules(ruleSet: RuleSet): RuleSummary {
  return {
    title: ruleSet.name,
    version: ruleSet.version,
    sections: [
      { id: 'format', heading: 'Format', sentences: formatSection(ruleSet) },
      { id: 'bout', heading: ruleSet.format === 'first-hit' ? 'What a bout is' : 'What an exchange is', sentences: boutSection(ruleSet) },
      { id: 'targets', heading: 'Targets and values', sentences: targetsSection(ruleSet) },
      { id: 'afterblow', heading: 'Afterblow', sentences: afterblowSection(ruleSet) },
      { id: 'doubles', heading: 'Doubles', sentences: doublesSection(ruleSet) },
      { id: 'cards', heading: 'Cards', sentences: cardsSection(ruleSet) },
      { id: 'ringOut', heading: 'Leaving the ring', sentences: ringOutSection(ruleSet) },
      { id: 'ranking', heading: 'Ranking in the pool', sentences: rankingSection(ruleSet) },
      { id: 'qualification', heading: 'Going on to the finals', sentences: qualificationSection(ruleSet) },
      { id: 'safety', heading: 'Safety', sentences: [...SAFETY_CAUTIONS] },
    ],
  }
}
