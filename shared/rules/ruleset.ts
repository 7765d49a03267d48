import { z } from 'zod'

export const FORMATS = ['first-hit', 'points'] as const
export type Format = typeof FORMATS[number]

export const TARGETS = ['head', 'torso', 'arms', 'hands', 'legs'] as const
export type Target = typeof TARGETS[number]

export const ACTIONS = ['cut', 'thrust'] as const
export type Action = typeof ACTIONS[number]

export const TIE_BREAKERS = [
  'unharmedBouts',
  'survivalRate',
  'wins',
  'indicator',
  'pointsScored',
  'pointsReceived',
  'doubles',
  'headToHead',
] as const
export type TieBreaker = typeof TIE_BREAKERS[number]

export const WITHDRAWAL_RULES = ['forfeit-remaining', 'annul-all'] as const
export type WithdrawalRule = typeof WITHDRAWAL_RULES[number]

function whole(field: string, min: number, max: number) {
  return z.number({ error: `${field}: enter a number` })
    .int({ error: `${field}: use a whole number` })
    .min(min, { error: `${field}: use at least ${min}` })
    .max(max, { error: `${field}: use at most ${max}` })
}

function targetSchema(target: Target) {
  return z.object({
    allowed: z.boolean({ error: `targets.${target}.allowed: choose true or false` }),
    cut: whole(`targets.${target}.cut`, 0, 20),
    thrust: whole(`targets.${target}.thrust`, 0, 20),
  }).strict()
}

export const targetsSchema = z.object({
  head: targetSchema('head'),
  torso: targetSchema('torso'),
  arms: targetSchema('arms'),
  hands: targetSchema('hands'),
  legs: targetSchema('legs'),
}, { error: 'targets: give head, torso, arms, hands and legs' }).strict()
  .refine(targets => TARGETS.some(t => targets[t].allowed), { error: 'targets: allow at least one target' })

export const afterblowSchema = z.discriminatedUnion('scoring', [
  z.object({ scoring: z.literal('full') }).strict(),
  z.object({ scoring: z.literal('difference') }).strict(),
  z.object({
    scoring: z.literal('fixed'),
    firstHitPoints: whole('afterblow.firstHitPoints', 0, 20),
    afterblowPoints: whole('afterblow.afterblowPoints', 0, 20),
  }).strict(),
], { error: 'afterblow.scoring: choose full, difference or fixed' })

export const doublesSchema = z.discriminatedUnion('scoring', [
  z.object({ scoring: z.literal('both') }).strict(),
  z.object({ scoring: z.literal('none') }).strict(),
  z.object({ scoring: z.literal('penalty'), penaltyPoints: whole('doubles.penaltyPoints', 1, 20) }).strict(),
], { error: 'doubles.scoring: choose both, none or penalty' })

export const cardsSchema = z.object({
  redPoints: whole('cards.redPoints', 0, 20),
}, { error: 'cards: give redPoints' }).strict()

export const ringOutSchema = z.discriminatedUnion('effect', [
  z.object({ effect: z.literal('none') }).strict(),
  z.object({ effect: z.literal('warning') }).strict(),
  z.object({ effect: z.literal('points'), points: whole('ringOut.points', 1, 20) }).strict(),
], { error: 'ringOut.effect: choose none, warning or points' })

export const rankingSchema = z.array(z.enum(TIE_BREAKERS, { error: `ranking: use ${TIE_BREAKERS.join(', ')}` }), { error: 'ranking: give a list of tie-breakers' })
  .max(TIE_BREAKERS.length, { error: `ranking: use at most ${TIE_BREAKERS.length} tie-breakers` })
  .refine(list => new Set(list).size === list.length, { error: 'ranking: list each tie-breaker once' })

export const qualificationSchema = z.object({
  topN: whole('qualification.topN', 1, 256).nullable().default(4),
  minSurvivalRate: z.number({ error: 'qualification.minSurvivalRate: enter a number from 0 to 1' })
    .min(0, { error: 'qualification.minSurvivalRate: use a number from 0 to 1' })
    .max(1, { error: 'qualification.minSurvivalRate: use a number from 0 to 1' })
    .nullable().default(null),
}, { error: 'qualification: give topN, minSurvivalRate or both' }).strict()
  .refine(q => q.topN !== null || q.minSurvivalRate !== null, {
    error: 'qualification: set topN, minSurvivalRate or both',
    path: ['topN'],
  })

const common = {
  version: whole('version', 1, 1_000_000),
  name: z.string({ error: 'name: enter a name' }).trim()
    .min(1, { error: 'name: enter a name' })
    .max(120, { error: 'name: use at most 120 characters' }),
  targets: targetsSchema,
  afterblow: afterblowSchema,
  doubles: doublesSchema,
  doubleOutLimit: whole('doubleOutLimit', 1, 20).nullable().default(null),
  cards: cardsSchema,
  ringOut: ringOutSchema,
  ranking: rankingSchema,
  withdrawn: z.enum(WITHDRAWAL_RULES, { error: 'withdrawn: choose forfeit-remaining or annul-all' }),
  qualification: qualificationSchema,
}

export const firstHitRuleSetSchema = z.object({
  format: z.literal('first-hit'),
  boutsPerMatch: whole('boutsPerMatch', 1, 15).default(3),
  ...common,
}).strict()

export const pointsRuleSetSchema = z.object({
  format: z.literal('points'),
  pointsToWin: whole('pointsToWin', 1, 100).nullable().default(null),
  timeLimitSeconds: whole('timeLimitSeconds', 10, 3600).nullable().default(null),
  ...common,
}).strict()
  .refine(r => r.pointsToWin !== null || r.timeLimitSeconds !== null, {
    error: 'pointsToWin or timeLimitSeconds: set at least one',
    path: ['pointsToWin'],
  })

/**
 * A rule set as the organiser writes it. `version` counts the organiser's revisions; the copy an
 * event freezes when pools start keeps its version, so every result can say which rules made it.
 */
export const ruleSetSchema = z.discriminatedUnion('format', [firstHitRuleSetSchema, pointsRuleSetSchema], {
  error: 'format: choose first-hit or points',
})

export type RuleSet = z.output<typeof ruleSetSchema>
export type RuleSetInput = z.input<typeof ruleSetSchema>
export type FirstHitRuleSet = Extract<RuleSet, { format: 'first-hit' }>
export type PointsRuleSet = Extract<RuleSet, { format: 'points' }>
export type TargetValues = RuleSet['targets']

export interface FieldProblem {
  field: string
  message: string
}

export type ParsedRuleSet = { ok: true, ruleSet: RuleSet } | { ok: false, problems: FieldProblem[] }

/** Parses organiser input; every problem names its field. */
export function parseRuleSet(input: unknown): ParsedRuleSet {
  const result = ruleSetSchema.safeParse(input)
  if (result.success) return { ok: true, ruleSet: result.data }
  return {
    ok: false,
    problems: result.error.issues.map(issue => ({ field: issue.path.map(String).join('.'), message: issue.message })),
  }
}

function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object') {
    for (const inner of Object.values(value)) deepFreeze(inner)
    Object.freeze(value)
  }
  return value
}

/** A deep, frozen copy: what a pool keeps once it starts, so later edits cannot reach it. */
export function freezeRuleSet<T extends RuleSet>(ruleSet: T): Readonly<T> {
  return deepFreeze(structuredClone(ruleSet))
}

/** Points for a hit on a target with an action. */
export function hitValue(ruleSet: RuleSet, target: Target, action: Action): number {
  return ruleSet.targets[target][action]
}
