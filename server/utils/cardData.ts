import { and, asc, eq, ne } from 'drizzle-orm'
import { deriveMatch } from '#shared/rules'
import type { MatchState } from '#shared/rules'
import { cardDates } from '#shared/cards/text'
import type {
  CardBout, CardContext, CardData, CardFighter, CardKind, CardQualification, CardSubject, FighterCardData, MatchCardData,
  PodiumCardData, PodiumPlace, PoolCardData, SummaryCardData,
} from '#shared/cards/types'
import type { DbTx } from './events'
import type { FighterRef } from './matches'
import type { LoadedPool } from './pools'
import type { FinalsView } from './finals'
import type { StandingRowView, TournamentTables } from './standings'

// What the cards are drawn from, built from the views the pages already use: the pool tables
// and qualification (tournamentTables), the finals (finalsView) and each match's state derived
// from its log. One source serves every card of a tournament, so a batch reads the data once.

type Club = typeof schema.clubs.$inferSelect
type Event = typeof schema.events.$inferSelect
type Tournament = typeof schema.tournaments.$inferSelect
type Match = typeof schema.matches.$inferSelect

export interface CardSource {
  club: Club
  event: Event
  tournament: Tournament
  context: CardContext
  format: 'first-hit' | 'points'
  refs: Map<number, FighterRef>
  pools: LoadedPool[]
  tables: TournamentTables | null
  finals: FinalsView
  /** Pool matches in pool order, then final matches in the order they are fenced. */
  matches: { row: Match, state: MatchState }[]
}

export function cardContext(club: Pick<Club, 'name'>, event: Pick<Event, 'name' | 'startsOn' | 'endsOn'>, tournamentName: string): CardContext {
  return { clubName: club.name, eventName: event.name, tournamentName, dates: cardDates(event.startsOn, event.endsOn) }
}

/** A club's tournament with its event, or 404; 409 while it still takes entries (nothing to show). */
export async function findCardTournament(tx: DbTx, clubId: number, tournamentId: number) {
  const t = schema.tournaments
  const e = schema.events
  const [row] = await tx.select({ tournament: t, event: e, club: schema.clubs }).from(t)
    .innerJoin(e, eq(e.id, t.eventId)).innerJoin(schema.clubs, eq(schema.clubs.id, e.clubId))
    .where(and(eq(t.id, tournamentId), eq(e.clubId, clubId)))
  if (!row) throw notFoundError('Tournament')
  if (row.tournament.phase === 'entries') {
    throw fieldError(409, 'tournamentId', 'This tournament is still taking entries: its cards can be made once the pools are drawn')
  }
  return row
}

/** Everything the cards of one tournament need. Must run in a transaction: a final table may record its lot. */
export async function loadCardSource(tx: DbTx, row: { club: Club, event: Event, tournament: Tournament }): Promise<CardSource> {
  const { tournament } = row
  const ruleSet = rulesOf(tournament)
  const refs = await fighterRefs(tx, tournament.id)
  const pools = await loadPools(tx, tournament.id)
  const tables = pools.length === 0 ? null : await tournamentTables(tx, tournament, pools)
  const finals = await finalsView(tx, tournament)
  const m = schema.matches
  const rows = await tx.select().from(m).where(eq(m.tournamentId, tournament.id))
  const poolNumbers = new Map(pools.map(p => [p.pool.id, p.pool.number]))
  rows.sort((x, y) => (x.stage === y.stage ? 0 : x.stage === 'pool' ? -1 : 1)
    || (poolNumbers.get(x.poolId ?? 0) ?? 0) - (poolNumbers.get(y.poolId ?? 0) ?? 0)
    || (x.orderInPool ?? 0) - (y.orderInPool ?? 0))
  const logs = await matchLogs(tx, rows.map(r => r.id))
  return {
    ...row,
    context: cardContext(row.club, row.event, tournament.name),
    format: ruleSet.format,
    refs,
    pools,
    tables,
    finals,
    matches: rows.map(r => ({ row: r, state: deriveMatch(ruleSet, payloads(logs.get(r.id)!)) })),
  }
}

const fighterOf = (ref: Pick<FighterRef, 'name' | 'clubName'>): CardFighter => ({ name: ref.name, clubName: ref.clubName })

/** A match that has a result to show: both fighters known, and finished or forfeited. */
export function hasResult(row: Match) {
  return row.sideAEntry !== null && row.sideBEntry !== null && (row.status === 'finished' || row.status === 'forfeit')
}

export function stageOf(source: CardSource, row: Match): string {
  if (row.stage === 'pool') {
    const number = source.pools.find(p => p.pool.id === row.poolId)?.pool.number
    return `Pool ${number ?? '?'}, match ${row.orderInPool}`
  }
  const bracket = source.finals.bracket
  const slot = bracket?.matches.find(b => b.id === row.bracketMatchKey)
  if (!bracket || !slot) return `Final, match ${row.orderInPool}`
  const siblings = bracket.matches.filter(b => b.kind === slot.kind && b.round === slot.round)
  return siblings.length > 1 ? `${slot.name} ${slot.slot + 1}` : slot.name
}

function boutsOf(state: MatchState): CardBout[] {
  return state.timeline
    .filter(item => item.status === 'applied' && item.bout !== null)
    .map(item => ({
      number: item.bout!,
      kind: item.kind === 'clean' || item.kind === 'afterblow' || item.kind === 'double' ? item.kind : 'other',
      points: item.points,
      hit: item.hit ?? { a: false, b: false },
    }))
}

/** A match as its card shows it, also while it is not over (for its public page); both fighters must be known. */
export function matchView(source: CardSource, row: Match, state: MatchState): MatchCardData {
  const forfeit = row.status === 'forfeit'
  return {
    kind: 'match',
    context: source.context,
    stage: stageOf(source, row),
    format: source.format,
    a: fighterOf(source.refs.get(row.sideAEntry!)!),
    b: fighterOf(source.refs.get(row.sideBEntry!)!),
    score: { a: state.sides.a.points, b: state.sides.b.points },
    status: row.status,
    result: forfeit ? (row.forfeitedBy === 'a' ? 'b' : 'a') : state.finished ? state.result : null,
    forfeitedBy: forfeit ? row.forfeitedBy : null,
    bouts: boutsOf(state),
  }
}

function matchCard(source: CardSource, matchId: number): MatchCardData {
  const found = source.matches.find(m => m.row.id === matchId)
  if (!found) throw notFoundError('Match')
  if (!hasResult(found.row)) throw fieldError(409, 'subjectId', 'This match has no result yet: its card can be made once it is over')
  return matchView(source, found.row, found.state)
}

function qualificationOf(source: CardSource, row: StandingRowView): CardQualification {
  if (row.status === 'withdrawn' || row.status === 'expelled') return row.status
  // Once the finals are drawn, the field is the answer; before, the outlook from the tables.
  if (source.finals.format !== null) return source.finals.field.includes(row.fighter.entryId) ? 'qualified' : 'out'
  return row.status === 'secured' ? 'qualified' : row.status === 'out' ? 'out' : 'in contention'
}

export function fighterCard(source: CardSource, entryId: number): FighterCardData {
  const ref = source.refs.get(entryId)
  if (!ref) throw notFoundError('Fighter')
  const tables = source.tables
  const pool = tables?.pools.find(p => p.rows.some(r => r.fighter.entryId === entryId))
  const row = pool?.rows.find(r => r.fighter.entryId === entryId)
  const overall = tables?.overall.rows.find(r => r.fighter.entryId === entryId)
  if (!tables || !pool || !row || !overall) throw fieldError(409, 'subjectId', `${ref.name} is in no pool of this tournament, so there is no pool summary to show`)
  return {
    kind: 'fighter',
    context: source.context,
    fighter: fighterOf(ref),
    pool: { number: pool.number, rank: row.rank, size: pool.rows.length, complete: pool.complete },
    overall: { rank: overall.rank, of: tables.overall.rows.length, complete: tables.overall.complete },
    record: { wins: row.wins, losses: row.losses, draws: row.draws },
    bouts: row.boutsFought,
    unharmed: row.unharmed,
    survivalRate: row.survivalRate,
    qualification: qualificationOf(source, row),
    topN: tables.cut.topN,
  }
}

function poolCard(source: CardSource, poolId: number): PoolCardData {
  const pool = source.tables?.pools.find(p => p.poolId === poolId)
  if (!pool) throw notFoundError('Pool')
  return {
    kind: 'pool',
    context: source.context,
    number: pool.number,
    complete: pool.complete,
    rows: pool.rows.map(r => ({
      rank: r.rank,
      name: r.fighter.name,
      clubName: r.fighter.clubName,
      wins: r.wins,
      losses: r.losses,
      draws: r.draws,
      bouts: r.boutsFought,
      unharmed: r.unharmed,
      survivalRate: r.survivalRate,
      indicator: r.indicator,
      out: r.status === 'withdrawn' || r.status === 'expelled',
    })),
  }
}

/** The most finalists a podium card lists before the finals end. */
export const PODIUM_MAX_FINALISTS = 8

function podiumCard(source: CardSource): PodiumCardData {
  const { finals } = source
  if (finals.format === null) throw fieldError(409, 'kind', 'The finals have not started yet: there is no final four or podium to show')
  const place = (entryId: number, n: number, seed: number | null): PodiumPlace => ({ place: n, fighter: fighterOf(source.refs.get(entryId)!), seed })
  if (finals.complete && finals.places) {
    const { first, second, third, fourth } = finals.places
    const places = [
      ...(first === null ? [] : [place(first, 1, null)]),
      ...(second === null ? [] : [place(second, 2, null)]),
      ...third.map(id => place(id, 3, null)),
      ...(fourth === null ? [] : [place(fourth, 4, null)]),
    ]
    return { kind: 'podium', context: source.context, complete: true, places }
  }
  const places = finals.field.slice(0, PODIUM_MAX_FINALISTS).map((id, i) => place(id, i + 1, i + 1))
  return { kind: 'podium', context: source.context, complete: false, places }
}

interface Tally { fighters: Set<number>, clubs: Set<string>, matches: number, bouts: number, doubles: number }

function tally(source: CardSource, into: Tally) {
  const fenced = source.pools.length > 0
    ? source.pools.flatMap(p => p.entryIds)
    : [...source.refs.values()].filter(r => r.status !== 'withdrawn').map(r => r.entryId)
  for (const id of fenced) {
    const ref = source.refs.get(id)!
    into.fighters.add(ref.fighterId)
    into.clubs.add(ref.clubName.trim().toLowerCase())
  }
  for (const { row, state } of source.matches) {
    if (!hasResult(row)) continue
    into.matches += 1
    into.bouts += state.bouts
    into.doubles += state.doubles
  }
}

function summaryOf(context: CardContext, t: Tally, winner: CardFighter | null): SummaryCardData {
  return {
    kind: 'summary',
    context,
    fighters: t.fighters.size,
    clubs: t.clubs.size,
    matches: t.matches,
    bouts: t.bouts,
    doubles: t.doubles,
    doublesRate: t.bouts === 0 ? null : t.doubles / t.bouts,
    winner,
  }
}

const emptyTally = (): Tally => ({ fighters: new Set(), clubs: new Set(), matches: 0, bouts: 0, doubles: 0 })

function summaryCard(source: CardSource): SummaryCardData {
  const t = emptyTally()
  tally(source, t)
  const first = source.finals.complete ? source.finals.places?.first ?? null : null
  return summaryOf(source.context, t, first === null ? null : fighterOf(source.refs.get(first)!))
}

/** The data of one card; `subjectId` names the match, entry or pool (ignored for the tournament's own cards). */
export function cardData(source: CardSource, kind: CardKind, subjectId: number | null): CardData {
  const id = subjectId ?? 0
  switch (kind) {
    case 'match': return matchCard(source, id)
    case 'fighter': return fighterCard(source, id)
    case 'pool': return poolCard(source, id)
    case 'podium': return podiumCard(source)
    case 'summary': return summaryCard(source)
  }
}

export interface CardSubjectOption {
  subject: CardSubject
  /** Match id, entry id, pool id, or the tournament's id. */
  id: number
  label: string
  kinds: CardKind[]
  /** For file names. */
  slug: string
}

/** Every card a tournament has to offer now, per subject, in the order the studio lists them. */
export function cardSubjects(source: CardSource): CardSubjectOption[] {
  const options: CardSubjectOption[] = []
  for (const { row, state } of source.matches) {
    if (!hasResult(row)) continue
    const a = source.refs.get(row.sideAEntry!)!
    const b = source.refs.get(row.sideBEntry!)!
    const score = row.status === 'forfeit' ? 'forfeit' : `${state.sides.a.points}–${state.sides.b.points}`
    const stage = stageOf(source, row)
    options.push({ subject: 'match', id: row.id, label: `${stage}: ${a.name} v ${b.name}, ${score}`, kinds: ['match'], slug: `${stage} ${a.name} v ${b.name}` })
  }
  const inPools = new Set(source.tables?.overall.rows.map(r => r.fighter.entryId) ?? [])
  const fighters = [...source.refs.values()].filter(r => inPools.has(r.entryId)).sort((x, y) => x.name.localeCompare(y.name))
  for (const ref of fighters) options.push({ subject: 'fighter', id: ref.entryId, label: `${ref.name} (${ref.clubName})`, kinds: ['fighter'], slug: ref.name })
  for (const pool of source.tables?.pools ?? []) {
    options.push({ subject: 'pool', id: pool.poolId, label: `Pool ${pool.number}${pool.complete ? '' : ' (in progress)'}`, kinds: ['pool'], slug: `pool ${pool.number}` })
  }
  options.push({
    subject: 'tournament',
    id: source.tournament.id,
    label: source.tournament.name,
    kinds: source.finals.format === null ? ['summary'] : ['podium', 'summary'],
    slug: source.tournament.name,
  })
  return options
}

/**
 * An event in numbers, for its link preview: every tournament past its entries counted together.
 * Must run in a transaction.
 */
export async function eventSummaryData(tx: DbTx, club: Club, event: Event): Promise<SummaryCardData> {
  const t = schema.tournaments
  const list = await tx.select().from(t).where(and(eq(t.eventId, event.id), ne(t.phase, 'entries'))).orderBy(asc(t.id))
  const total = emptyTally()
  for (const tournament of list) tally(await loadCardSource(tx, { club, event, tournament }), total)
  return summaryOf(cardContext(club, event, ''), total, null)
}

/** The published events of a club that a fighter of its roster entered, newest first, with their entries. */
export async function fighterEntries(tx: DbTx, clubId: number, fighterId: number) {
  const n = schema.entries
  const t = schema.tournaments
  const e = schema.events
  return tx.select({ entryId: n.id, tournament: t, event: e }).from(n)
    .innerJoin(t, eq(t.id, n.tournamentId)).innerJoin(e, eq(e.id, t.eventId))
    .where(and(eq(n.fighterId, fighterId), eq(e.clubId, clubId), eq(e.published, true), ne(t.phase, 'entries')))
    .orderBy(asc(e.startsOn), asc(t.id))
    .then(rows => rows.reverse())
}
