import { and, eq, inArray, sql } from 'drizzle-orm'
import { z } from 'zod'
import { idParamSchema } from '#shared/schemas/club'
import type { FinalsFormat, TournamentPhase } from '#shared/schemas/tournament'
import { MAX_ROUND_ROBIN_FINALISTS, nextPhase } from '#shared/schemas/tournament'
import type { Db } from './db'

export type DbTx = Db | Parameters<Parameters<Db['transaction']>[0]>[0]
type Event = typeof schema.events.$inferSelect
type Tournament = typeof schema.tournaments.$inferSelect

export const eventParams = z.object({ clubId: idParamSchema, eventId: idParamSchema })
export const tournamentParams = eventParams.extend({ tournamentId: idParamSchema })
export const entryParams = tournamentParams.extend({ entryId: idParamSchema })

export function notFoundError(what: string) {
  return createError({ statusCode: 404, statusMessage: 'Not Found', message: `${what} not found` })
}

export function conflictError(message: string) {
  return createError({ statusCode: 409, statusMessage: 'Conflict', message })
}

/** True for PostgreSQL's foreign_key_violation, also when Drizzle wraps the driver's error. */
export function isForeignKeyViolation(err: unknown): boolean {
  const codeOf = (e: unknown) => (typeof e === 'object' && e !== null && 'code' in e ? (e as { code: unknown }).code : undefined)
  return codeOf(err) === '23503' || (typeof err === 'object' && err !== null && 'cause' in err && codeOf((err as { cause: unknown }).cause) === '23503')
}

export async function findEvent(db: DbTx, clubId: number, eventId: number, options: { lock?: boolean } = {}) {
  const e = schema.events
  const query = db.select().from(e).where(and(eq(e.id, eventId), eq(e.clubId, clubId)))
  const [event] = options.lock ? await query.for('update') : await query
  if (!event) throw notFoundError('Event')
  return event
}

/**
 * The tournament with its event, scoped to the club. With `lock`, the tournament row is held until
 * the transaction ends, so entry changes and phase changes of one tournament happen one at a time.
 */
export async function findTournament(db: DbTx, ids: { clubId: number, eventId: number, tournamentId: number }, options: { lock?: boolean } = {}) {
  const t = schema.tournaments
  const e = schema.events
  const query = db.select({ tournament: t, event: e }).from(t).innerJoin(e, eq(e.id, t.eventId))
    .where(and(eq(t.id, ids.tournamentId), eq(t.eventId, ids.eventId), eq(e.clubId, ids.clubId)))
  const [row] = options.lock ? await query.for('update', { of: t }) : await query
  if (!row) throw notFoundError('Tournament')
  return row
}

const PHASE_LABELS: Record<TournamentPhase, string> = {
  entries: 'taking entries',
  pools: 'in the pools',
  finals: 'in the finals',
  done: 'finished',
}

/** 409 unless the tournament is in one of the given phases. */
export function requirePhase(tournament: Tournament, phases: readonly TournamentPhase[], doing: string) {
  if (!phases.includes(tournament.phase)) {
    throw conflictError(`The tournament is ${PHASE_LABELS[tournament.phase]}: ${doing} is no longer possible`)
  }
}

export interface EntryCounts { entered: number, checkedIn: number, withdrawn: number }

export async function entryCounts(db: DbTx, tournamentIds: number[]): Promise<Map<number, EntryCounts>> {
  const counts = new Map<number, EntryCounts>()
  for (const id of tournamentIds) counts.set(id, { entered: 0, checkedIn: 0, withdrawn: 0 })
  if (tournamentIds.length === 0) return counts
  const n = schema.entries
  const rows = await db.select({ tournamentId: n.tournamentId, status: n.status, n: sql<number>`count(*)::int` })
    .from(n).where(inArray(n.tournamentId, tournamentIds)).groupBy(n.tournamentId, n.status)
  for (const row of rows) {
    const c = counts.get(row.tournamentId)!
    if (row.status === 'entered') c.entered = row.n
    else if (row.status === 'checked-in') c.checkedIn = row.n
    else c.withdrawn = row.n
  }
  return counts
}

export function eventView(event: Event) {
  return {
    id: event.id,
    name: event.name,
    slug: event.slug,
    startsOn: event.startsOn,
    endsOn: event.endsOn,
    venue: event.venue,
    rings: event.rings,
    published: event.published,
    publishedAt: event.publishedAt,
    emergencyNumber: event.emergencyNumber,
    firstAidPoint: event.firstAidPoint,
    createdAt: event.createdAt,
    updatedAt: event.updatedAt,
  }
}

export function tournamentView(tournament: Tournament, ruleSetName: string | null, counts: EntryCounts | undefined) {
  return {
    id: tournament.id,
    eventId: tournament.eventId,
    name: tournament.name,
    weapon: tournament.weapon,
    ruleSet: { id: tournament.ruleSetId, name: ruleSetName, version: tournament.ruleSetVersion },
    frozenRules: tournament.frozenRules,
    phase: tournament.phase,
    nextPhase: nextPhase(tournament.phase),
    poolSize: tournament.poolSize,
    qualifyCount: tournament.qualifyCount,
    finalsFormat: tournament.finalsFormat,
    bronzeMatch: tournament.bronzeMatch,
    entries: counts ?? { entered: 0, checkedIn: 0, withdrawn: 0 },
    createdAt: tournament.createdAt,
    updatedAt: tournament.updatedAt,
  }
}

/** The tournaments of some events, with rule-set names and entry counts, in creation order. */
export async function tournamentsOf(db: DbTx, eventIds: number[]) {
  if (eventIds.length === 0) return []
  const t = schema.tournaments
  const rows = await db.select({ tournament: t, ruleSetName: schema.ruleSets.name }).from(t)
    .leftJoin(schema.ruleSets, eq(schema.ruleSets.id, t.ruleSetId))
    .where(inArray(t.eventId, eventIds)).orderBy(t.id)
  const counts = await entryCounts(db, rows.map(r => r.tournament.id))
  return rows.map(r => tournamentView(r.tournament, r.ruleSetName, counts.get(r.tournament.id)))
}

/**
 * The rule-set version a tournament will use: it must belong to the club, and without an explicit
 * version the current one is taken. Bad choices are 400s on the field the form shows.
 */
export async function chooseRuleSet(db: DbTx, clubId: number, ruleSetId: number, version: number | undefined) {
  const [ruleSet] = await db.select().from(schema.ruleSets)
    .where(and(eq(schema.ruleSets.id, ruleSetId), eq(schema.ruleSets.clubId, clubId)))
  if (!ruleSet) throw fieldError(400, 'ruleSetId', 'No rule set with this id in this club')
  const wanted = version ?? ruleSet.currentVersion
  const v = schema.ruleSetVersions
  const [chosen] = await db.select().from(v).where(and(eq(v.ruleSetId, ruleSet.id), eq(v.version, wanted)))
  if (!chosen) throw fieldError(400, 'ruleSetVersion', `“${ruleSet.name}” has versions 1 to ${ruleSet.currentVersion}`)
  return { ruleSet, version: wanted, settings: chosen.settings }
}

/** 400 on `qualifyCount` when a round-robin final would hold more fighters than it can. */
export function requireRoundRobinSize(format: FinalsFormat, qualifyCount: number) {
  if (format === 'round-robin' && qualifyCount > MAX_ROUND_ROBIN_FINALISTS) {
    throw fieldError(400, 'qualifyCount', `A round-robin final holds at most ${MAX_ROUND_ROBIN_FINALISTS} fighters; lower the number who reach the finals or choose a bracket`)
  }
}

export function eventSlugTaken() {
  return fieldError(409, 'slug', 'Another event of this club already uses this address')
}

export function tournamentNameTaken() {
  return fieldError(409, 'name', 'This event already has a tournament with this name')
}

/** One tournament as the organizer's pages show it, with its event's name. */
export async function tournamentDetail(db: DbTx, ids: { clubId: number, eventId: number, tournamentId: number }) {
  const { tournament, event } = await findTournament(db, ids)
  const [ruleSet] = await db.select({ name: schema.ruleSets.name }).from(schema.ruleSets).where(eq(schema.ruleSets.id, tournament.ruleSetId))
  const counts = await entryCounts(db, [tournament.id])
  return {
    ...tournamentView(tournament, ruleSet?.name ?? null, counts.get(tournament.id)),
    event: { id: event.id, name: event.name, slug: event.slug },
  }
}

/** What anyone may see of a published event. */
export function publicEventSummary(event: Event) {
  return {
    name: event.name,
    slug: event.slug,
    startsOn: event.startsOn,
    endsOn: event.endsOn,
    venue: event.venue,
    rings: event.rings,
  }
}
