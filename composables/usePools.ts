import { openFinalMatches } from '#shared/tournament'
import type { FinalsFormat, TournamentPhase } from '#shared/schemas/tournament'
import type { Bracket, BracketPlaces } from '#shared/tournament'

// Pools, standings and the bracket of a tournament (routes under …/tournaments/:tournamentId).

export type MatchStage = 'pool' | 'final'
export type MatchStatus = 'scheduled' | 'under-way' | 'finished' | 'forfeit'

export interface MatchSide {
  entryId: number
  fighterId?: number
  name: string
  clubName: string
}

export interface MatchSummary {
  id: number
  poolId: number | null
  stage: MatchStage
  bracketKey: string | null
  order: number | null
  sideA: MatchSide | null
  sideB: MatchSide | null
  status: MatchStatus
  version?: number
  score: { a: number, b: number }
  bouts: { counted: number, void: number }
  winner: 'a' | 'b' | 'draw' | null
  finishedReason: string | null
  forfeit?: { side: 'a' | 'b', reason: string | null } | null
}

export interface PoolFighterView {
  entryId: number
  fighterId?: number
  name: string
  clubName: string
  seed?: number | null
  position: number
  status: TournamentEntryStatus
}

/** A pool; `id` is null in a draw's preview, before anything is stored. */
export interface PoolView {
  id: number | null
  number: number
  ringNumber: number
  fighters: PoolFighterView[]
  matches: MatchSummary[]
}

/** A club clash the draw could not avoid, with the fighters' names. */
export interface DrawNote {
  kind: string
  poolNumber: number
  clubName: string
  fighters: string[]
  message: string
}

export interface DrawResponse {
  pools: PoolView[]
  notes: DrawNote[]
  drawKey: string
  dryRun: boolean
}

export interface MoveResponse {
  pools: PoolView[]
  warnings: { kind: string, message: string }[]
}

export interface StandingFighter {
  entryId: number
  fighterId?: number
  name: string
  clubName: string
  seed?: number | null
}

export interface StandingRowView {
  rank: number
  fighter: StandingFighter
  /** Withdrawn or expelled, else where the fighter stands against the cut. */
  status: CutStatusView | 'withdrawn' | 'expelled'
  matchesFought: number
  wins: number
  losses: number
  draws: number
  boutsFought: number
  unharmed: number
  survivalRate: number | null
  scored: number
  received: number
  indicator: number
  doubles: number
  separatedBy?: string | null
}

export interface LotView {
  seed: string | null
  provisional: boolean
  draws: { entryIds: number[], order: number[] }[]
}

export type CutStatusView = 'secured' | 'reachable' | 'out'

export interface FighterOutlookView {
  rank: number
  fighter: StandingFighter
  active: boolean
  status: CutStatusView
  remainingMatches: number
  remainingBouts: number | null
  survival: { status: CutStatusView, need: number | null } | null
}

export interface PoolStandingsView {
  poolId: number
  number: number
  complete: boolean
  rows: StandingRowView[]
  lot?: LotView
}

export interface StandingsResponse {
  pools: PoolStandingsView[]
  overall: { complete: boolean, pendingMatches?: number, rows: StandingRowView[], lot?: LotView } | null
  qualification?: { topN: number | null, minSurvivalRate: number | null, complete: boolean, fighters: FighterOutlookView[] } | null
  cut: { topN: number | null, minSurvivalRate: number | null }
}

/** The finals (…/bracket): empty before them; `field` is the finalists' entry ids, best first. */
export interface FinalsResponse {
  format: FinalsFormat | null
  field: number[]
  bracket: Bracket | null
  table: { complete: boolean, rows: StandingRowView[], lot?: LotView } | null
  places: BracketPlaces | null
  matches: MatchSummary[]
  complete: boolean
}

/**
 * Final matches still to fence or to settle, as closing the tournament counts them: a bracket
 * match that ended level waits for the director's decision.
 */
export function openFinalMatchCount(finals: Pick<FinalsResponse, 'format' | 'matches'>): number {
  return openFinalMatches(finals.format, finals.matches).length
}

/** The places as lines to show, e.g. First: Hedda Crane; names by entry id. */
export function placeLines(places: BracketPlaces | null, nameOf: (entryId: number) => string | null) {
  if (!places) return []
  const name = (id: number | null) => (id === null ? null : nameOf(id))
  return [
    { place: 'First', names: [name(places.first)] },
    { place: 'Second', names: [name(places.second)] },
    { place: 'Third', names: places.third.map(name) },
    { place: 'Fourth', names: [name(places.fourth)] },
  ]
    .map(row => ({ place: row.place, names: row.names.filter((n): n is string => Boolean(n)) }))
    .filter(row => row.names.length > 0)
}

/** One line per drawn lot of a table: the tied fighters in the order the lot placed them. */
export function lotLines(rows: StandingRowView[], lot?: LotView): string[] {
  if (!lot || lot.draws.length === 0) return []
  const names = new Map(rows.map(r => [r.fighter.entryId, r.fighter.name]))
  return lot.draws.map(d => d.order.map(id => names.get(id) ?? `#${id}`).join(', '))
}

// ——— the club site ———

export interface PublicEventSummary {
  name: string
  slug: string
  startsOn: string
  endsOn: string
  venue: string
  rings: number
}

export interface PublicEventView {
  club: PublicClub
  event: PublicEventSummary & { safety: { emergencyNumber: string, firstAidPoint: string } }
  tournaments: { id: number, name: string, weapon: string, phase: TournamentPhase, entries: number }[]
  openGraph?: OpenGraphLinks
}

export interface PublicTournamentView {
  event: PublicEventSummary
  tournament: { id: number, name: string, weapon: string, phase: TournamentPhase }
  pools: PoolView[]
  standings: {
    pools: PoolStandingsView[]
    overall: { complete: boolean, rows: StandingRowView[] } | null
    cut: { topN: number | null, minSurvivalRate: number | null }
  } | null
  finals: {
    format: FinalsFormat
    bracket: Bracket | null
    table: { complete: boolean, rows: StandingRowView[] } | null
    places: BracketPlaces | null
    matches: MatchSummary[]
  } | null
}

/** A published event for a page of the club site; without it the page shows the error page (404 for an unknown address). */
export async function usePublicEvent(base: MaybeRefOrGetter<string>, key: MaybeRefOrGetter<string>, page: string) {
  const result = await useFetch<PublicEventView>(base, { key: () => `public-event-${toValue(key)}` })
  if (result.error.value || !result.data.value) {
    const status = apiStatus(result.error.value) ?? 500
    throw createError({
      status,
      statusText: status === 404 ? 'Not Found' : `The ${page} is unavailable`,
      message: status === 404 ? 'There is no published event at this address.' : `The ${page} did not load.`,
      fatal: true,
    })
  }
  return result
}

export function usePools(base: MaybeRefOrGetter<string>, key: MaybeRefOrGetter<string>) {
  return useFetch<{ pools: PoolView[] }>(() => `${toValue(base)}/pools`, {
    key: () => `pools-${toValue(key)}`,
  })
}

export function useStandings(base: MaybeRefOrGetter<string>, key: MaybeRefOrGetter<string>) {
  return useFetch<StandingsResponse>(() => `${toValue(base)}/standings`, {
    key: () => `standings-${toValue(key)}`,
  })
}

export function useFinals(base: MaybeRefOrGetter<string>, key: MaybeRefOrGetter<string>) {
  return useFetch<FinalsResponse>(() => `${toValue(base)}/bracket`, {
    key: () => `bracket-${toValue(key)}`,
  })
}

/** "62.5%" for 0.625; a dash before the first bout. */
export function percent(rate: number | null | undefined): string {
  if (rate === null || rate === undefined || Number.isNaN(rate)) return '–'
  return `${Number((rate * 100).toFixed(1))}%`
}

export function signed(n: number): string {
  return n > 0 ? `+${n}` : n < 0 ? `−${Math.abs(n)}` : '0'
}

/** A fighter's place against the cut: the outlook's status, or why they are out of the table. */
export type StandingMark = CutStatusView | 'withdrawn' | 'expelled'

export const STANDING_MARK_NAMES: Record<StandingMark, string> = {
  secured: 'Qualified',
  reachable: 'Can still qualify',
  out: 'Out',
  withdrawn: 'Withdrawn',
  expelled: 'Expelled',
}

export const STANDING_MARK_TONES: Record<StandingMark, string> = {
  secured: 'bg-moss-100 text-moss-700',
  reachable: 'bg-brass-100 text-brass-800',
  out: 'bg-ink-100 text-ink-600',
  withdrawn: 'bg-rust-100 text-rust-700',
  expelled: 'bg-rust-100 text-rust-700',
}

export const MATCH_STATUS_NAMES: Record<MatchStatus, string> = {
  'scheduled': 'To fence',
  'under-way': 'Under way',
  'finished': 'Finished',
  'forfeit': 'Forfeit',
}
