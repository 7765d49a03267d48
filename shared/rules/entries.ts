import { z } from 'zod'
import { ACTIONS, TARGETS } from './ruleset'
import type { FieldProblem, RuleSet, Target } from './ruleset'

export const SIDES = ['a', 'b'] as const
export type Side = typeof SIDES[number]

export const CARD_COLOURS = ['warning', 'yellow', 'red', 'black'] as const
export type CardColour = typeof CARD_COLOURS[number]

export const VOID_REASONS = ['not-seen', 'no-valid-hit'] as const
export type VoidReason = typeof VOID_REASONS[number]

export function otherSide(side: Side): Side {
  return side === 'a' ? 'b' : 'a'
}

const side = z.enum(SIDES, { error: 'side: choose a or b' })
const target = z.enum(TARGETS, { error: `target: choose ${TARGETS.join(', ')}` })
const action = z.enum(ACTIONS, { error: 'action: choose cut or thrust' })

export const hitSchema = z.object({ target, action }).strict()
export type Hit = z.infer<typeof hitSchema>

const entryId = z.string({ error: 'id: give the entry an id' })
  .min(1, { error: 'id: give the entry an id' })
  .max(64, { error: 'id: use at most 64 characters' })

const base = {
  id: entryId,
  at: z.iso.datetime({ offset: true, error: 'at: use an ISO date and time' }).optional(),
}

/**
 * One line of a match's log, as the ring desk records it. The log is append-only: a mistake is
 * corrected by a `cancel` entry naming the entry it takes back, never by editing or deleting.
 */
export const matchEntrySchema = z.discriminatedUnion('kind', [
  /** One fighter hit, the other did not. */
  z.object({ kind: z.literal('clean'), ...base, side, target, action }).strict(),
  /** `side` hit first; the other fighter answered within the afterblow with `afterblow`. */
  z.object({ kind: z.literal('afterblow'), ...base, side, target, action, afterblow: hitSchema }).strict(),
  /** Both hit at once; `a` is the hit fighter a landed, `b` the one fighter b landed. */
  z.object({ kind: z.literal('double'), ...base, a: hitSchema, b: hitSchema }).strict(),
  /** The bout is fenced again and counts for nothing. */
  z.object({ kind: z.literal('void'), ...base, reason: z.enum(VOID_REASONS, { error: 'reason: choose not-seen or no-valid-hit' }) }).strict(),
  z.object({ kind: z.literal('card'), ...base, side, colour: z.enum(CARD_COLOURS, { error: 'colour: choose warning, yellow, red or black' }) }).strict(),
  /** `side` left the ring. */
  z.object({ kind: z.literal('ring-out'), ...base, side }).strict(),
  /** The director called time (points format with a time limit). */
  z.object({ kind: z.literal('time-up'), ...base }).strict(),
  /** `side` gives up the match, e.g. injury or a suspected concussion. */
  z.object({ kind: z.literal('concede'), ...base, side }).strict(),
  /** Takes back an earlier entry; cancelling a cancel puts the entry back. */
  z.object({ kind: z.literal('cancel'), ...base, targetId: entryId }).strict(),
], { error: 'kind: unknown entry kind' })

export type MatchEntry = z.infer<typeof matchEntrySchema>
export type EntryKind = MatchEntry['kind']

function checkTarget(ruleSet: RuleSet, field: string, value: Target, problems: FieldProblem[]): void {
  if (!ruleSet.targets[value].allowed) {
    problems.push({ field, message: `${field}: ${value} is not an allowed target in this rule set` })
  }
}

/**
 * Problems of an entry under a rule set (the shape itself is checked by `matchEntrySchema`).
 * The desk should refuse an entry with problems; a stored one is shown as rejected and counts for
 * nothing.
 */
export function checkEntry(ruleSet: RuleSet, entry: MatchEntry): FieldProblem[] {
  const problems: FieldProblem[] = []
  switch (entry.kind) {
    case 'clean':
      checkTarget(ruleSet, 'target', entry.target, problems)
      break
    case 'afterblow':
      checkTarget(ruleSet, 'target', entry.target, problems)
      checkTarget(ruleSet, 'afterblow.target', entry.afterblow.target, problems)
      break
    case 'double':
      checkTarget(ruleSet, 'a.target', entry.a.target, problems)
      checkTarget(ruleSet, 'b.target', entry.b.target, problems)
      break
    case 'time-up':
      if (ruleSet.format !== 'points' || ruleSet.timeLimitSeconds === null) {
        problems.push({ field: 'kind', message: 'kind: time-up needs a points rule set with a time limit' })
      }
      break
    default:
      break
  }
  return problems
}
