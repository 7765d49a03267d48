import { z } from 'zod'
import { emailSchema } from './auth'
import { slugSchema } from './club'

// A tournament only moves forward, one phase at a time.
export const TOURNAMENT_PHASES = ['entries', 'pools', 'finals', 'done'] as const
export type TournamentPhase = typeof TOURNAMENT_PHASES[number]

export const ENTRY_STATUSES = ['entered', 'checked-in', 'withdrawn'] as const

/** How the finalists fence for the places: an elimination bracket, or a round robin among them. */
export const FINALS_FORMATS = ['bracket', 'round-robin'] as const
export type FinalsFormat = typeof FINALS_FORMATS[number]
export type EntryStatus = typeof ENTRY_STATUSES[number]

export const MAX_RINGS = 8
export const MAX_SEED = 999

/** The phase after this one, or null once the tournament is done. */
export function nextPhase(phase: TournamentPhase): TournamentPhase | null {
  return TOURNAMENT_PHASES[TOURNAMENT_PHASES.indexOf(phase) + 1] ?? null
}

/** Trims and collapses runs of spaces, so "Anna  Berg " and "Anna Berg" are the same fighter. */
export function tidySpaces(value: string): string {
  return value.trim().replace(/\s+/g, ' ')
}

/** The key under which two fighters are the same person: name and club, ignoring case and spacing. */
export function fighterKey(name: string, clubName: string): string {
  return `${tidySpaces(name).toLowerCase()}\u0000${tidySpaces(clubName).toLowerCase()}`
}

const text = (max: number, missing: string) => z.string({ error: missing }).transform(tidySpaces)
  .pipe(z.string().min(1, { error: missing }).max(max, { error: `Use at most ${max} characters` }))

const optionalText = (max: number) => z.string({ error: 'Must be text' }).trim()
  .max(max, { error: `Use at most ${max} characters` })

// A plain string comparison orders ISO dates; the range keeps typos like 0226 out.
const isoDate = (missing: string) => z.iso.date({ error: missing })
  .refine(value => value >= '1900-01-01' && value <= '2999-12-31', { error: 'Use a date between 1900 and 2999' })

// ——— rule sets ———

export const ruleSetNameSchema = text(120, 'Enter a name for the rule set')

/**
 * `settings` is checked by the rule engine's schema on the server; here it only has to be an object.
 * Exactly one of `preset` (a preset's name) and `settings` starts a new rule set.
 */
export const ruleSetCreateSchema = z.object({
  name: ruleSetNameSchema,
  preset: z.string({ error: 'Choose a preset by name' }).trim().min(1, { error: 'Choose a preset by name' }).max(60).optional(),
  settings: z.record(z.string(), z.unknown(), { error: 'Send the settings as an object' }).optional(),
}).strict().superRefine((value, ctx) => {
  if (value.preset === undefined && value.settings === undefined) {
    ctx.addIssue({ code: 'custom', path: ['settings'], message: 'Choose a preset or send the settings' })
  }
  if (value.preset !== undefined && value.settings !== undefined) {
    ctx.addIssue({ code: 'custom', path: ['preset'], message: 'Send either a preset or settings, not both' })
  }
})

/** A rename keeps the version; new settings make a new version and leave the old ones as they were. */
export const ruleSetPatchSchema = z.object({
  name: ruleSetNameSchema.optional(),
  settings: z.record(z.string(), z.unknown(), { error: 'Send the settings as an object' }).optional(),
}).strict().refine(value => value.name !== undefined || value.settings !== undefined, { error: 'Send a new name or new settings' })

// ——— events ———

const eventFields = {
  name: text(120, 'Enter the event name'),
  slug: slugSchema,
  startsOn: isoDate('Enter the first day as YYYY-MM-DD'),
  endsOn: isoDate('Enter the last day as YYYY-MM-DD'),
  venue: optionalText(200),
  rings: z.number({ error: 'Enter the number of rings' }).int({ error: 'Use a whole number' })
    .min(1, { error: 'At least one ring' }).max(MAX_RINGS, { error: `At most ${MAX_RINGS} rings` }),
  // Shown in the safety notice; both are needed before the event can be published.
  emergencyNumber: optionalText(40),
  firstAidPoint: optionalText(200),
}

export function endsBeforeStart(value: { startsOn: string, endsOn: string }): boolean {
  return value.endsOn < value.startsOn
}

export const ENDS_BEFORE_START = 'The last day cannot be before the first day'

export const eventSchema = z.object({
  ...eventFields,
  venue: eventFields.venue.default(''),
  rings: eventFields.rings.default(1),
  emergencyNumber: eventFields.emergencyNumber.default(''),
  firstAidPoint: eventFields.firstAidPoint.default(''),
}).strict().superRefine((value, ctx) => {
  if (endsBeforeStart(value)) ctx.addIssue({ code: 'custom', path: ['endsOn'], message: ENDS_BEFORE_START })
})

/** Any subset of the event's fields; the date order is checked against the stored event. */
export const eventPatchSchema = z.object(eventFields).partial().strict()
  .refine(value => Object.keys(value).length > 0, { error: 'Send at least one field to change' })

// ——— tournaments ———

/** A round robin of more than eight finalists takes longer than a bracket is worth. */
export const MAX_ROUND_ROBIN_FINALISTS = 8

function roundRobinSize(value: { finalsFormat?: FinalsFormat, qualifyCount?: number }, ctx: z.RefinementCtx) {
  if (value.finalsFormat === 'round-robin' && value.qualifyCount !== undefined && value.qualifyCount > MAX_ROUND_ROBIN_FINALISTS) {
    ctx.addIssue({ code: 'custom', path: ['qualifyCount'], message: `A round-robin final holds at most ${MAX_ROUND_ROBIN_FINALISTS} fighters` })
  }
}

const tournamentFields = {
  name: text(120, 'Enter the tournament name'),
  weapon: text(60, 'Enter the weapon, e.g. longsword'),
  ruleSetId: z.number({ error: 'Choose a rule set' }).int({ error: 'Choose a rule set' }).positive({ error: 'Choose a rule set' }).max(2147483647),
  // Without it, the rule set's current version is chosen.
  ruleSetVersion: z.number({ error: 'Must be a version number' }).int({ error: 'Must be a whole number' }).positive({ error: 'Must be 1 or more' }).max(2147483647),
  poolSize: z.number({ error: 'Enter the pool size' }).int({ error: 'Use a whole number' })
    .min(3, { error: 'A pool needs at least 3 fighters' }).max(12, { error: 'At most 12 fighters in a pool' }),
  qualifyCount: z.number({ error: 'Enter how many reach the finals' }).int({ error: 'Use a whole number' })
    .min(2, { error: 'At least 2 reach the finals' }).max(64, { error: 'At most 64 reach the finals' }),
  finalsFormat: z.enum(FINALS_FORMATS, { error: 'Choose a bracket or a round robin' }),
  // A match for third place between the semifinal losers (brackets of four or more).
  bronzeMatch: z.boolean({ error: 'Choose whether there is a match for third place' }),
}

export const tournamentSchema = z.object({
  ...tournamentFields,
  ruleSetVersion: tournamentFields.ruleSetVersion.optional(),
  poolSize: tournamentFields.poolSize.default(5),
  // Without it, the rule set's own number (its top N) is taken.
  qualifyCount: tournamentFields.qualifyCount.optional(),
  finalsFormat: tournamentFields.finalsFormat.default('bracket'),
  bronzeMatch: tournamentFields.bronzeMatch.default(true),
}).strict().superRefine(roundRobinSize)

export const tournamentPatchSchema = z.object(tournamentFields).partial().strict()
  .refine(value => Object.keys(value).length > 0, { error: 'Send at least one field to change' })
  .superRefine(roundRobinSize)

export const phaseChangeSchema = z.object({
  to: z.enum(TOURNAMENT_PHASES, { error: `Use one of: ${TOURNAMENT_PHASES.join(', ')}` }),
}).strict()

// ——— fighters and entries ———

/** An optional e-mail address: empty or null means none; otherwise lower-cased like sign-in addresses. */
export const optionalEmailSchema = z.string({ error: 'Enter a valid e-mail address, or leave it empty' }).nullable()
  .transform(value => (value ?? '').trim())
  .pipe(z.union([z.literal(''), emailSchema], { error: 'Enter a valid e-mail address' }))
  .transform(value => value || null)

export const fighterNameSchema = text(100, 'Enter the fighter\'s name')
export const fighterClubSchema = text(120, 'Enter the fighter\'s club (or "Independent")')

export const fighterSchema = z.object({
  name: fighterNameSchema,
  clubName: fighterClubSchema,
  email: optionalEmailSchema.optional().transform(value => value ?? null),
}).strict()

export const fighterPatchSchema = z.object({
  name: fighterNameSchema,
  clubName: fighterClubSchema,
  email: optionalEmailSchema,
}).partial().strict().refine(value => Object.keys(value).length > 0, { error: 'Send at least one field to change' })

export const seedSchema = z.number({ error: 'Must be a whole number ≥ 1, or null' }).int({ error: 'Must be a whole number ≥ 1' })
  .min(1, { error: 'Must be a whole number ≥ 1' }).max(MAX_SEED, { error: `At most ${MAX_SEED}` })

export const entryCreateSchema = z.object({
  fighterId: z.number({ error: 'Choose a fighter from the roster' }).int({ error: 'Choose a fighter from the roster' })
    .positive({ error: 'Choose a fighter from the roster' }).max(2147483647, { error: 'Choose a fighter from the roster' }),
  seed: seedSchema.nullable().default(null),
}).strict()

export const entryPatchSchema = z.object({ seed: seedSchema.nullable() }).strict()

// Check-in is the moment the kit and the blade are inspected: both must be confirmed.
export const checkInSchema = z.object({
  kitChecked: z.literal(true, { error: 'Confirm that the fighter\'s protective kit was checked' }),
  weaponChecked: z.literal(true, { error: 'Confirm that the weapon was flex-checked and its tip is blunt and covered' }),
}).strict()

export const withdrawSchema = z.object({
  reason: text(300, 'Give a reason, e.g. injury or suspected concussion'),
}).strict()

export const MAX_IMPORT_BYTES = 1024 * 1024
export const MAX_IMPORT_ROWS = 2000

export const entryImportSchema = z.object({
  csv: z.string({ error: 'Send the CSV file\'s text' }),
  dryRun: z.boolean({ error: 'Say whether this is a preview (true) or the import (false)' }),
}).strict()

export type RuleSetCreateInput = z.infer<typeof ruleSetCreateSchema>
export type EventInput = z.infer<typeof eventSchema>
export type TournamentInput = z.infer<typeof tournamentSchema>
export type FighterInput = z.infer<typeof fighterSchema>
export type CheckInInput = z.infer<typeof checkInSchema>
export type EntryImportInput = z.infer<typeof entryImportSchema>
