import { TARGETS, ruleSetSchema } from '#shared/rules'
import type { Format, RuleSet, Target, TieBreaker, WithdrawalRule } from '#shared/rules'
import type { FinalsFormat, TournamentPhase } from '#shared/schemas/tournament'

// Rule sets and events: the organizer's set-up before the day. Shapes follow the route files under
// server/api/clubs/[clubId]/{rule-sets,events}.

export interface RuleSetListItem {
  id: number
  name: string
  currentVersion: number
  createdAt: string
  updatedAt: string
  usedBy: number
}

export interface RuleSetVersionInfo {
  version: number
  createdAt: string
  createdBy: number | null
  createdByName: string | null
}

export interface RuleSetDetail extends RuleSetListItem {
  settings: RuleSet
  versions: RuleSetVersionInfo[]
  tournaments: { id: number, eventId: number, name: string, version: number, phase: TournamentPhase }[]
}

export interface RuleSetPreset {
  name: string
  settings: RuleSet
}

export interface EntryCountsView {
  entered: number
  checkedIn: number
  withdrawn: number
}

export interface EventTournament {
  id: number
  eventId: number
  name: string
  weapon: string
  ruleSet: { id: number, name: string | null, version: number }
  frozenRules: RuleSet | null
  phase: TournamentPhase
  nextPhase: TournamentPhase | null
  poolSize: number
  qualifyCount: number
  finalsFormat: FinalsFormat
  bronzeMatch: boolean
  entries: EntryCountsView
  createdAt: string
  updatedAt: string
}

export interface ClubEvent {
  id: number
  name: string
  slug: string
  startsOn: string
  endsOn: string
  venue: string
  rings: number
  published: boolean
  publishedAt: string | null
  emergencyNumber: string
  firstAidPoint: string
  createdAt: string
  updatedAt: string
  tournaments: EventTournament[]
}

export function useRuleSets(clubId: MaybeRefOrGetter<number>) {
  return useFetch<{ ruleSets: RuleSetListItem[] }>(() => `/api/clubs/${toValue(clubId)}/rule-sets`, {
    key: () => `rule-sets-${toValue(clubId)}`,
  })
}

export function useRuleSetPresets(clubId: MaybeRefOrGetter<number>) {
  return useFetch<{ presets: RuleSetPreset[] }>(() => `/api/clubs/${toValue(clubId)}/rule-sets/presets`, {
    key: () => `rule-set-presets-${toValue(clubId)}`,
  })
}

export function useRuleSet(clubId: MaybeRefOrGetter<number>, ruleSetId: MaybeRefOrGetter<number>) {
  return useFetch<RuleSetDetail>(() => `/api/clubs/${toValue(clubId)}/rule-sets/${toValue(ruleSetId)}`, {
    key: () => `rule-set-${toValue(clubId)}-${toValue(ruleSetId)}`,
  })
}

export function useClubEvents(clubId: MaybeRefOrGetter<number>) {
  return useFetch<{ events: ClubEvent[] }>(() => `/api/clubs/${toValue(clubId)}/events`, {
    key: () => `club-events-${toValue(clubId)}`,
  })
}

export function useClubEvent(clubId: MaybeRefOrGetter<number>, eventId: MaybeRefOrGetter<number>) {
  return useFetch<ClubEvent>(() => `/api/clubs/${toValue(clubId)}/events/${toValue(eventId)}`, {
    key: () => `club-event-${toValue(clubId)}-${toValue(eventId)}`,
  })
}

/** A positive whole number from a route parameter, or 0 (which no row has). */
export function routeId(value: unknown): number {
  const text = Array.isArray(value) ? value[0] : value
  const n = Number(text)
  return Number.isInteger(n) && n > 0 ? n : 0
}

/** Lower-case letters, digits and single hyphens, as the event address wants. */
export function slugify(text: string): string {
  return text.normalize('NFKD').replace(/[\u0300-\u036F]/g, '').toLowerCase()
    .replace(/&/g, ' and ').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 48).replace(/-+$/, '')
}

const dayFormat = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' })
const dayMonth = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', timeZone: 'UTC' })

// Event days are calendar dates without a time zone: read and shown as UTC, so the server and
// the browser print the same day.
function dateOf(iso: string): Date | null {
  const date = new Date(`${iso}T00:00:00Z`)
  return Number.isNaN(date.getTime()) ? null : date
}

/** "Sat, 3 Oct 2026" or "3 Oct – Sun, 4 Oct 2026". */
export function eventDates(startsOn: string, endsOn: string): string {
  const start = dateOf(startsOn)
  const end = dateOf(endsOn)
  if (!start) return startsOn
  if (!end || startsOn === endsOn) return dayFormat.format(start)
  return `${dayMonth.format(start)} – ${dayFormat.format(end)}`
}

export const WEAPON_SUGGESTIONS = ['Longsword', 'Sword and buckler', 'Rapier', 'Rapier and dagger', 'Messer', 'Sabre', 'Smallsword'] as const

// ——— the rule-set editor's draft ———

/**
 * A rule set as the editor holds it: every field of both formats, numbers that may be blank while
 * typed, and the optional limits as switches, so switching format or a limit off and on again
 * keeps what was typed.
 */
export interface RulesDraft {
  format: Format
  boutsPerMatch: number | null
  pointsLimit: boolean
  pointsToWin: number | null
  timeLimit: boolean
  timeLimitSeconds: number | null
  targets: Record<Target, { allowed: boolean, cut: number | null, thrust: number | null }>
  afterblow: { scoring: 'full' | 'difference' | 'fixed', firstHitPoints: number | null, afterblowPoints: number | null }
  doubles: { scoring: 'both' | 'none' | 'penalty', penaltyPoints: number | null }
  doubleOut: boolean
  doubleOutLimit: number | null
  redPoints: number | null
  ringOut: { effect: 'none' | 'warning' | 'points', points: number | null }
  ranking: TieBreaker[]
  withdrawn: WithdrawalRule
  useTopN: boolean
  topN: number | null
  useMinRate: boolean
  /** The minimum survival rate as a percentage, 0 to 100. */
  minSurvivalPercent: number | null
}

export function rulesDraftOf(rules: RuleSet): RulesDraft {
  const targets = Object.fromEntries(TARGETS.map(t => [t, { ...rules.targets[t] }])) as RulesDraft['targets']
  const afterblow = rules.afterblow
  const doubles = rules.doubles
  const ringOut = rules.ringOut
  const { topN, minSurvivalRate } = rules.qualification
  return {
    format: rules.format,
    boutsPerMatch: rules.format === 'first-hit' ? rules.boutsPerMatch : 3,
    pointsLimit: rules.format === 'points' ? rules.pointsToWin !== null : true,
    pointsToWin: rules.format === 'points' ? rules.pointsToWin ?? 7 : 7,
    timeLimit: rules.format === 'points' ? rules.timeLimitSeconds !== null : true,
    timeLimitSeconds: rules.format === 'points' ? rules.timeLimitSeconds ?? 180 : 180,
    targets,
    afterblow: {
      scoring: afterblow.scoring,
      firstHitPoints: afterblow.scoring === 'fixed' ? afterblow.firstHitPoints : 2,
      afterblowPoints: afterblow.scoring === 'fixed' ? afterblow.afterblowPoints : 1,
    },
    doubles: { scoring: doubles.scoring, penaltyPoints: doubles.scoring === 'penalty' ? doubles.penaltyPoints : 1 },
    doubleOut: rules.doubleOutLimit !== null,
    doubleOutLimit: rules.doubleOutLimit ?? 3,
    redPoints: rules.cards.redPoints,
    ringOut: { effect: ringOut.effect, points: ringOut.effect === 'points' ? ringOut.points : 1 },
    ranking: [...rules.ranking],
    withdrawn: rules.withdrawn,
    useTopN: topN !== null,
    topN: topN ?? 4,
    useMinRate: minSurvivalRate !== null,
    minSurvivalPercent: minSurvivalRate === null ? 50 : Number((minSurvivalRate * 100).toFixed(1)),
  }
}

/** The settings the API takes (name and version are the server's to stamp). */
export function settingsOfDraft(draft: RulesDraft): Record<string, unknown> {
  const common = {
    targets: Object.fromEntries(TARGETS.map(t => [t, { ...draft.targets[t] }])),
    afterblow: draft.afterblow.scoring === 'fixed'
      ? { scoring: 'fixed', firstHitPoints: draft.afterblow.firstHitPoints, afterblowPoints: draft.afterblow.afterblowPoints }
      : { scoring: draft.afterblow.scoring },
    doubles: draft.doubles.scoring === 'penalty'
      ? { scoring: 'penalty', penaltyPoints: draft.doubles.penaltyPoints }
      : { scoring: draft.doubles.scoring },
    doubleOutLimit: draft.doubleOut ? draft.doubleOutLimit : null,
    cards: { redPoints: draft.redPoints },
    ringOut: draft.ringOut.effect === 'points' ? { effect: 'points', points: draft.ringOut.points } : { effect: draft.ringOut.effect },
    ranking: [...draft.ranking],
    withdrawn: draft.withdrawn,
    qualification: {
      topN: draft.useTopN ? draft.topN : null,
      minSurvivalRate: draft.useMinRate
        ? (draft.minSurvivalPercent === null ? null : Math.round(draft.minSurvivalPercent * 10) / 1000)
        : null,
    },
  }
  if (draft.format === 'first-hit') return { format: 'first-hit', boutsPerMatch: draft.boutsPerMatch, ...common }
  return {
    format: 'points',
    pointsToWin: draft.pointsLimit ? draft.pointsToWin : null,
    timeLimitSeconds: draft.timeLimit ? draft.timeLimitSeconds : null,
    ...common,
  }
}

// Where the engine's message would confuse the form (it speaks of rates from 0 to 1), ours.
const FIELD_MESSAGES: Record<string, string> = {
  'qualification.minSurvivalRate': 'Use a percentage from 0 to 100',
}

/** Field errors keyed by the settings path (`targets.head.cut`), without the path in the text. */
export function rulesFieldErrors(issues: readonly { path: readonly PropertyKey[], message: string }[]): Record<string, string> {
  const fields: Record<string, string> = {}
  for (const issue of issues) {
    const path = issue.path.map(String).join('.') || 'settings'
    const text = issue.message.startsWith(`${path}: `) ? issue.message.slice(path.length + 2) : issue.message
    fields[path] ??= FIELD_MESSAGES[path] ?? text.charAt(0).toUpperCase() + text.slice(1)
  }
  return fields
}

/** The server's `data.fields` for a rule set: `settings.targets.head.cut` becomes `targets.head.cut`. */
export function rulesServerErrors(fields: Record<string, string>): Record<string, string> {
  return Object.fromEntries(Object.entries(fields).map(([key, text]) => [key.replace(/^settings\./, ''), text]))
}

export type ParsedDraft = { ok: true, rules: RuleSet } | { ok: false, errors: Record<string, string> }

/** The draft checked by the engine's own schema, as the server will check it. */
export function parseRulesDraft(draft: RulesDraft, name: string, version: number): ParsedDraft {
  // A limit switched on but left blank would read as "no limit" to the schema: say so instead.
  const blank: Record<string, string> = {}
  const enter = 'Enter a number, or switch this off'
  if (draft.format === 'points' && draft.pointsLimit && draft.pointsToWin === null) blank.pointsToWin = enter
  if (draft.format === 'points' && draft.timeLimit && draft.timeLimitSeconds === null) blank.timeLimitSeconds = enter
  if (draft.doubleOut && draft.doubleOutLimit === null) blank.doubleOutLimit = enter
  if (draft.useTopN && draft.topN === null) blank['qualification.topN'] = enter
  if (draft.useMinRate && draft.minSurvivalPercent === null) blank['qualification.minSurvivalRate'] = 'Enter a percentage from 0 to 100, or switch this off'
  const result = ruleSetSchema.safeParse({ ...settingsOfDraft(draft), name: name.trim() || 'Untitled rule set', version })
  if (result.success && Object.keys(blank).length === 0) return { ok: true, rules: result.data }
  return { ok: false, errors: { ...(result.success ? {} : rulesFieldErrors(result.error.issues)), ...blank } }
}

export const TIE_BREAKER_NAMES: Record<TieBreaker, { label: string, text: string }> = {
  unharmedBouts: { label: 'Unharmed bouts', text: 'Bouts in which the fighter was not validly hit; most first.' },
  survivalRate: { label: 'Survival rate', text: 'Unharmed bouts ÷ bouts fought; highest first.' },
  wins: { label: 'Wins', text: 'Matches won; most first.' },
  indicator: { label: 'Indicator', text: 'Points scored minus points received; highest first.' },
  pointsScored: { label: 'Points scored', text: 'Most first.' },
  pointsReceived: { label: 'Points received', text: 'Fewest first.' },
  doubles: { label: 'Doubles', text: 'Fewest first.' },
  headToHead: { label: 'Head-to-head', text: 'Wins in the matches among the fighters still level.' },
}
