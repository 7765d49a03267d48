import { firstHitRuleSetSchema, freezeRuleSet, pointsRuleSetSchema } from './ruleset'
import type { FirstHitRuleSet, PointsRuleSet, RuleSet, RuleSetInput } from './ruleset'

// Values are a starting point the organiser edits, not a standard: every one is common practice
// with no single source.

const zoneValues = {
  head: { allowed: true, cut: 3, thrust: 3 },
  torso: { allowed: true, cut: 2, thrust: 2 },
  arms: { allowed: true, cut: 1, thrust: 1 },
  hands: { allowed: true, cut: 1, thrust: 1 },
  legs: { allowed: true, cut: 1, thrust: 1 },
} satisfies RuleSetInput['targets']

const firstHitThreeBoutsInput = {
  version: 1,
  name: 'First hit, three bouts',
  format: 'first-hit',
  boutsPerMatch: 3,
  targets: zoneValues,
  afterblow: { scoring: 'full' },
  doubles: { scoring: 'none' },
  doubleOutLimit: null,
  cards: { redPoints: 1 },
  ringOut: { effect: 'warning' },
  ranking: ['unharmedBouts', 'pointsScored', 'pointsReceived', 'doubles', 'headToHead'],
  // Annulling keeps the survival count fair: a forfeit gives its winner no bouts to survive.
  withdrawn: 'annul-all',
  qualification: { topN: 4, minSurvivalRate: null },
} satisfies RuleSetInput

const pointsToSevenInput = {
  version: 1,
  name: 'Points to seven',
  format: 'points',
  pointsToWin: 7,
  timeLimitSeconds: 180,
  targets: zoneValues,
  afterblow: { scoring: 'difference' },
  doubles: { scoring: 'none' },
  doubleOutLimit: 3,
  cards: { redPoints: 1 },
  ringOut: { effect: 'points', points: 1 },
  ranking: ['wins', 'indicator', 'pointsScored', 'doubles'],
  withdrawn: 'forfeit-remaining',
  qualification: { topN: 4, minSurvivalRate: null },
} satisfies RuleSetInput

// Frozen so that no caller can change a preset for everyone; edit a `presetCopy` instead.
export const firstHitThreeBouts: FirstHitRuleSet = freezeRuleSet(firstHitRuleSetSchema.parse(firstHitThreeBoutsInput))
export const pointsToSeven: PointsRuleSet = freezeRuleSet(pointsRuleSetSchema.parse(pointsToSevenInput))

export const PRESETS = {
  'first-hit-three-bouts': firstHitThreeBouts,
  'points-to-seven': pointsToSeven,
} as const satisfies Record<string, RuleSet>

export type PresetId = keyof typeof PRESETS

/** A fresh, editable copy of a preset. */
export function presetCopy<Id extends PresetId>(id: Id): typeof PRESETS[Id] {
  return structuredClone(PRESETS[id])
}
