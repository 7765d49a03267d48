import { and, asc, eq, inArray } from 'drizzle-orm'
import { z } from 'zod'
import { checkEntry, deriveMatch, matchEntrySchema, otherSide } from '#shared/rules'
import type { MatchEntry, MatchState, RuleSet, Side } from '#shared/rules'
import { idParamSchema } from '#shared/schemas/club'
import type { DbTx } from './events'

// The one place where match logs are read, checked, appended and turned into what the routes
// answer. A match's score is never stored: it is derived from its log by the rule engine.

type Match = typeof schema.matches.$inferSelect
type Tournament = typeof schema.tournaments.$inferSelect
type StoredEntry = typeof schema.matchEntries.$inferSelect

export const matchParams = tournamentParams.extend({ matchId: idParamSchema })
export const poolParams = tournamentParams.extend({ poolId: idParamSchema })

/** The most entries one request may append; a desk sends a few at a time. */
export const MAX_ENTRIES_PER_REQUEST = 100

export interface FighterRef {
  entryId: number
  fighterId: number
  name: string
  clubName: string
  seed: number | null
  status: 'entered' | 'checked-in' | 'withdrawn'
}

export interface MatchSummary {
  id: number
  poolId: number | null
  stage: 'pool' | 'final'
  bracketKey: string | null
  order: number | null
  sideA: FighterRef | null
  sideB: FighterRef | null
  status: Match['status']
  version: number
  score: { a: number, b: number }
  bouts: { counted: number, void: number }
  winner: Side | 'draw' | null
  finishedReason: string | null
  forfeit: { side: Side, reason: string | null } | null
  startedAt: Date | null
  finishedAt: Date | null
}

/** The frozen copy of the rules, which every match of a started tournament uses. */
export function rulesOf(tournament: Tournament): RuleSet {
  if (!tournament.frozenRules) throw conflictError('The tournament is still taking entries: it has no pools or matches yet')
  return tournament.frozenRules
}

/** Every entry of the tournament with its fighter, by entry id. */
export async function fighterRefs(db: DbTx, tournamentId: number): Promise<Map<number, FighterRef>> {
  const n = schema.entries
  const f = schema.fighters
  const rows = await db.select({
    entryId: n.id, fighterId: f.id, name: f.name, clubName: f.clubName, seed: n.seed, status: n.status,
  }).from(n).innerJoin(f, eq(f.id, n.fighterId)).where(eq(n.tournamentId, tournamentId))
  return new Map(rows.map(row => [row.entryId, row]))
}

/** The logs of some matches, each in the order it was recorded. */
export async function matchLogs(db: DbTx, matchIds: number[]): Promise<Map<number, StoredEntry[]>> {
  const logs = new Map<number, StoredEntry[]>(matchIds.map(id => [id, []]))
  if (matchIds.length === 0) return logs
  const e = schema.matchEntries
  const rows = await db.select().from(e).where(inArray(e.matchId, matchIds)).orderBy(asc(e.matchId), asc(e.seq))
  for (const row of rows) logs.get(row.matchId)!.push(row)
  return logs
}

export function payloads(log: readonly Pick<StoredEntry, 'payload'>[]): MatchEntry[] {
  return log.map(row => row.payload)
}

export function matchSummary(match: Match, refs: ReadonlyMap<number, FighterRef>, state: MatchState): MatchSummary {
  const ref = (entryId: number | null) => (entryId === null ? null : refs.get(entryId) ?? null)
  let winner: MatchSummary['winner'] = null
  let finishedReason: string | null = null
  if (match.status === 'forfeit') {
    winner = otherSide(match.forfeitedBy!)
    finishedReason = 'forfeit'
  }
  else if (state.finished) {
    winner = state.result === 'both-lose' ? null : state.result
    finishedReason = state.endReason
  }
  return {
    id: match.id,
    poolId: match.poolId,
    stage: match.stage,
    bracketKey: match.bracketMatchKey,
    order: match.orderInPool,
    sideA: ref(match.sideAEntry),
    sideB: ref(match.sideBEntry),
    status: match.status,
    version: match.version,
    score: { a: state.sides.a.points, b: state.sides.b.points },
    bouts: { counted: state.bouts, void: state.voids },
    winner,
    finishedReason,
    forfeit: match.status === 'forfeit' ? { side: match.forfeitedBy!, reason: match.forfeitReason } : null,
    startedAt: match.startedAt,
    finishedAt: match.finishedAt,
  }
}

/** Summaries of some matches of one tournament, in the order given. */
export async function matchSummaries(db: DbTx, tournament: Tournament, rows: readonly Match[], refs?: ReadonlyMap<number, FighterRef>) {
  if (rows.length === 0) return []
  const ruleSet = rulesOf(tournament)
  const known = refs ?? await fighterRefs(db, tournament.id)
  const logs = await matchLogs(db, rows.map(m => m.id))
  return rows.map(m => matchSummary(m, known, deriveMatch(ruleSet, payloads(logs.get(m.id)!))))
}

/** A match of the tournament, read without a lock. */
export async function findMatch(db: DbTx, tournamentId: number, matchId: number) {
  const m = schema.matches
  const [match] = await db.select().from(m).where(and(eq(m.id, matchId), eq(m.tournamentId, tournamentId)))
  if (!match) throw notFoundError('Match')
  return match
}

export interface LockedMatch {
  tournament: Tournament
  /** The event's number of rings. */
  rings: number
  match: Match
  /** Its pool's number and the ring it is fenced in. */
  place: { poolNumber: number | null, ring: number }
  /** The two fighters, by entry id. */
  sides: Map<number, FighterRef>
}

type LogRow = Pick<StoredEntry, 'id' | 'seq' | 'payload'>

const sideColumns = (side: 'a' | 'b') => `${side}e.id as "${side}_entryId", ${side}f.id as "${side}_fighterId", ${side}f.name as "${side}_name",
  ${side}f.club_name as "${side}_clubName", ${side}e.seed as "${side}_seed", ${side}e.status as "${side}_status"`

// A match with its tournament, ring, pool and fighters in one statement, prepared once per
// connection (rawSql.ts). The tournament comes first in FROM, so that with locks its row is
// locked before the match's, the order every other writer takes them in.
const MATCH_CONTEXT = `select ${columnsOf(schema.tournaments, 't', 't_')}, e.rings as "rings",
      ${columnsOf(schema.matches, 'm', 'm_')}, p.number as "poolNumber", p.ring_number as "poolRing",
      ${sideColumns('a')}, ${sideColumns('b')}`
const MATCH_FROM = `from tournaments t
    join events e on e.id = t.event_id
    join matches m on m.tournament_id = t.id
    left join pools p on p.id = m.pool_id
    left join entries ae on ae.id = m.side_a_entry left join fighters af on af.id = ae.fighter_id
    left join entries be on be.id = m.side_b_entry left join fighters bf on bf.id = be.fighter_id
    where t.id = $1 and t.event_id = $2 and e.club_id = $3 and m.id = $4`
const LOCK_MATCH = { name: 'match_lock', text: `${MATCH_CONTEXT} ${MATCH_FROM} for share of t for update of m` }
// Without locks, and with the log read in the same snapshot unless the caller has it for this version already.
const READ_MATCH = {
  name: 'match_read',
  text: `${MATCH_CONTEXT}, case when m.version = $5 then null else (
      select coalesce(json_agg(json_build_object('id', x.id, 'seq', x.seq, 'payload', x.payload) order by x.seq), '[]'::json)
      from match_entries x where x.match_id = m.id) end as "log"
    ${MATCH_FROM}`,
}

type MatchIds = { clubId: number, eventId: number, tournamentId: number, matchId: number }

async function matchContext(tx: DbTx, ids: MatchIds, query: { name: string, text: string }, extra: unknown[] = []) {
  const [found] = await rawQuery<Record<string, unknown>>(tx, { ...query, values: [ids.tournamentId, ids.eventId, ids.clubId, ids.matchId, ...extra] })
  if (!found) {
    // Which of the two is missing, for the message.
    await findTournament(tx, ids)
    throw notFoundError('Match')
  }
  const tournament = unprefix<Tournament>(found, 't_')
  const match = unprefix<Match>(found, 'm_')
  const rings = found.rings as number
  const sides = new Map<number, FighterRef>()
  for (const side of ['a_', 'b_']) {
    const ref = unprefix<FighterRef>(found, side)
    if (ref.entryId !== null) sides.set(ref.entryId, ref)
  }
  const poolRing = found.poolRing as number | null
  const context: LockedMatch = {
    tournament,
    rings,
    match,
    place: { poolNumber: found.poolNumber as number | null, ring: ringOf(match.poolId === null ? null : poolRing ?? 1, rings) },
    sides,
  }
  return { context, log: found.log as LogRow[] | null | undefined }
}

/**
 * A match route's match with all it needs, locked until the transaction ends: the tournament
 * with a share lock, so that matches of one tournament are recorded side by side while a draw, a
 * move or a phase change (which take its row for update) waits for them, and the match for update.
 */
export async function lockMatch(tx: DbTx, ids: MatchIds): Promise<LockedMatch> {
  return (await matchContext(tx, ids, LOCK_MATCH)).context
}

// The logs of the matches this process wrote last, by match id and version. Every change of a
// match bumps its version, so a version names one log for good: the next bout of the same match
// finds its log here instead of reading it again. Filled only after the commit.
const recentLogs = new Map<number, { version: number, log: LogRow[] }>()
const RECENT_LOGS = 256

function rememberLog(matchId: number, version: number, log: LogRow[]) {
  recentLogs.delete(matchId)
  if (recentLogs.size >= RECENT_LOGS) recentLogs.delete(recentLogs.keys().next().value!)
  recentLogs.set(matchId, { version, log })
}

/** The match and its log as of one snapshot, without locks (the log from memory when this process has it). */
async function readMatch(db: DbTx, ids: MatchIds): Promise<{ context: LockedMatch, log: LogRow[] }> {
  const known = recentLogs.get(ids.matchId)
  const { context, log } = await matchContext(db, ids, READ_MATCH, [known?.version ?? -1])
  return { context, log: log ?? known!.log }
}

const MATCH_LOG = {
  name: 'match_log',
  text: 'select id, seq, payload from match_entries where match_id = $1 order by seq',
}

/** Pool matches are fenced in the pools phase, final matches in the finals. */
export function requireMatchPhase(tournament: Tournament, match: Match, doing: string) {
  requirePhase(tournament, [match.stage === 'pool' ? 'pools' : 'finals'], doing)
}

export function requireBothSides(match: Match) {
  if (match.sideAEntry === null || match.sideBEntry === null) {
    throw conflictError('This final match is waiting for the winner of an earlier match; both fighters must be known first')
  }
}

// ——— appending entries ———

export const appendBodySchema = z.object({
  expectedVersion: z.number({ error: 'Send the version of the match you last saw' })
    .int({ error: 'Send the version of the match you last saw' }).min(0, { error: 'Versions start at 0' }),
  entries: z.array(z.unknown(), { error: 'Send a list of entries' })
    .min(1, { error: 'Send at least one entry' })
    .max(MAX_ENTRIES_PER_REQUEST, { error: `Send at most ${MAX_ENTRIES_PER_REQUEST} entries at a time` }),
}).strict()

/**
 * Each entry checked by the engine's schema; a problem is reported as `entries.<index>.<field>`.
 * The engine's messages start with their field, which is not repeated.
 */
export function parseEntries(raw: readonly unknown[]): MatchEntry[] {
  const issues: z.core.$ZodIssue[] = []
  const parsed = raw.map((value, index) => {
    const result = matchEntrySchema.safeParse(value)
    if (result.success) return result.data
    for (const issue of result.error.issues) {
      const field = issue.path.map(String).join('.')
      const last = String(issue.path[issue.path.length - 1] ?? '')
      let message = issue.message
      if (issue.path.length === 0 && issue.code === 'invalid_type') message = 'send each entry as an object with a kind'
      else if (field && message.startsWith(`${field}: `)) message = message.slice(field.length + 2)
      else if (last && message.startsWith(`${last}: `)) message = message.slice(last.length + 2)
      issues.push({ ...issue, path: ['entries', index, ...issue.path], message })
    }
    return null
  })
  if (issues.length > 0) throw badRequest(issues, 'entries')
  return parsed as MatchEntry[]
}

function entryProblem(index: number, field: string, message: string) {
  const text = field && message.startsWith(`${field}: `) ? message.slice(field.length + 2) : message
  return fieldError(400, field ? `entries.${index}.${field}` : `entries.${index}`, text)
}

/** The answer for a desk whose view is out of date: 409 with what the match is now. */
function staleVersion(summary: MatchSummary, state: MatchState, expected: number) {
  return createError({
    statusCode: 409,
    statusMessage: 'Conflict',
    message: `expectedVersion: the match is at version ${summary.version}, not ${expected}; refresh and send the new entries again`,
    data: { fields: { expectedVersion: `The match is at version ${summary.version}` }, match: summary, state },
  })
}

export interface AppendResult {
  match: MatchSummary
  state: MatchState
  stored: string[]
  duplicates: string[]
}

type AppendInput = { expectedVersion: number, entries: MatchEntry[] }

/**
 * What appending would do, checked against the log it was read with: ids the log already holds
 * (or repeated in the request) are duplicates and skipped; every new entry must be accepted by the
 * engine on the state before it; any refusal throws and nothing is written. `write` is null when
 * everything was a duplicate.
 */
function planAppend(context: LockedMatch, log: readonly LogRow[], input: AppendInput, userId: number) {
  const { tournament, match, sides: refs } = context
  requireMatchPhase(tournament, match, 'recording entries')
  requireBothSides(match)
  const ruleSet = rulesOf(tournament)
  const known = new Set(log.map(row => row.id))
  const fresh: { index: number, entry: MatchEntry }[] = []
  const duplicates: string[] = []
  input.entries.forEach((entry, index) => {
    if (known.has(entry.id)) {
      duplicates.push(entry.id)
      return
    }
    known.add(entry.id)
    fresh.push({ index, entry })
  })
  const before = deriveMatch(ruleSet, payloads(log))
  if (fresh.length === 0) {
    return { answer: { match: matchSummary(match, refs, before), state: before, stored: [], duplicates }, write: null }
  }

  for (const { index, entry } of fresh) {
    const problem = checkEntry(ruleSet, entry)[0]
    if (problem) throw entryProblem(index, problem.field, problem.message)
  }
  if (match.version !== input.expectedVersion) throw staleVersion(matchSummary(match, refs, before), before, input.expectedVersion)
  if (match.status === 'forfeit' || match.status === 'finished' || before.finished) {
    throw conflictError('The match has ended; no more entries can be added to it')
  }

  const entries = payloads(log)
  let state = before
  for (const { index, entry } of fresh) {
    if (state.finished) {
      throw fieldError(409, `entries.${index}`, `The match ended with entry ${entries[entries.length - 1]!.id}; nothing can follow it`)
    }
    entries.push(entry)
    state = deriveMatch(ruleSet, entries)
    const item = state.timeline[state.timeline.length - 1]!
    if (item.status === 'rejected') throw entryProblem(index, item.problems[0]?.field ?? '', item.problems[0]?.message ?? 'not valid under these rules')
    if (item.status === 'ignored' && item.reason === 'unknown-target') {
      throw entryProblem(index, 'targetId', 'names no earlier entry of this match')
    }
  }

  const now = new Date()
  const updated: Match = {
    ...match,
    version: match.version + 1,
    status: state.finished ? 'finished' : 'under-way',
    startedAt: match.startedAt ?? now,
    finishedAt: state.finished ? now : null,
  }
  const rows = fresh.map(({ entry }, k) => ({ id: entry.id, seq: log.length + k + 1, payload: entry }))
  // The entries and the match's new version, status and times, written only if the match is
  // still at the version they were planned on and its tournament still in the right phase.
  const statement = {
    name: 'match_append',
    gate: 'upd',
    text: `t as (
        select id from tournaments where id = $9 and phase = $10::tournament_phase for share
      ), upd as (
        update matches set version = $5, status = $6::match_status, started_at = $7::timestamptz, finished_at = $8::timestamptz
        where id = $1 and version = $11 and exists (select 1 from t)
        returning id
      ), ins as (
        insert into match_entries (id, match_id, seq, payload, recorded_by, recorded_at)
        select x.id, $1, x.seq, x.payload, $2, $3::timestamptz
        from upd, jsonb_to_recordset($4::jsonb) as x(id text, seq int, payload jsonb)
      )`,
    values: [match.id, userId, now.toISOString(), JSON.stringify(rows), updated.version, updated.status,
      updated.startedAt!.toISOString(), updated.finishedAt?.toISOString() ?? null,
      tournament.id, match.stage === 'pool' ? 'pools' : 'finals', match.version],
  }
  return {
    answer: { match: matchSummary(updated, refs, state), state, stored: fresh.map(f => f.entry.id), duplicates },
    write: { statement, updated, entries, state, log: [...log, ...rows] },
  }
}

/**
 * Appends a desk's entries to a match's append-only log. A pool match takes one statement after
 * one read, without holding locks in between: the write goes through only if the match is still
 * at the version the entries were checked on (and the tournament in its pools), otherwise the
 * match is read again and the desk told what happened (a resend is answered as duplicates, a
 * stale view with 409). A final match that ends moves the bracket on in the same transaction,
 * with the rows locked from the start.
 */
export async function appendEntries(ids: MatchIds, input: AppendInput, userId: number): Promise<AppendResult> {
  const db = useDb()
  const first = await readMatch(db, ids)
  if (first.context.match.stage === 'final') {
    return db.transaction(async (tx) => {
      const context = await lockMatch(tx, ids)
      const log = await rawQuery<LogRow>(tx, { ...MATCH_LOG, values: [context.match.id] })
      const plan = planAppend(context, log, input, userId)
      if (plan.write) {
        const { statement, updated, entries, state } = plan.write
        await rawQuery(tx, { ...statement, name: `${statement.name}_alone`, text: `with ${statement.text} select 1` })
        if (state.finished && (state.result === 'a' || state.result === 'b')) await advanceFinal(tx, context.tournament.id, updated, state.result)
        await publishMatch(tx, context, updated, entries, state)
      }
      return plan.answer
    })
  }
  for (const attempt of [1, 2]) {
    const { context, log } = attempt === 1 ? first : await readMatch(db, ids)
    const plan = planAppend(context, log, input, userId)
    if (!plan.write) return plan.answer
    const { statement, updated, entries, state } = plan.write
    const { sent } = await publishMatch(db, context, updated, entries, state, statement)
    if (sent) {
      rememberLog(updated.id, updated.version, plan.write.log)
      return plan.answer
    }
    // Another desk (or the same one, resending) got there first, or the phase changed: read
    // again and answer from what is stored now.
  }
  throw conflictError('The match changed while the entries were being saved; refresh and send them again')
}

// ——— the schedule's estimates ———

// Our own estimates, not a standard: a first-hit bout with its halt, judges' call and reset takes
// about a minute and a half; a points match runs to its time limit plus about a minute of halts.
export const FIRST_HIT_MINUTES_PER_BOUT = 1.5
export const POINTS_MINUTES_OVER_TIME_LIMIT = 1
// A points match to N points without a time limit: a typical three-minute match plus the halts.
export const POINTS_OPEN_MINUTES = 4
export const CHANGEOVER_MINUTES = 1
export const RING_CHANGE_MINUTES = 2
// Finals are fenced in the first ring, where the camera for the stream usually is.
export const FINALS_RING = 1

export function estimatedMinutes(ruleSet: RuleSet): number {
  if (ruleSet.format === 'first-hit') return ruleSet.boutsPerMatch * FIRST_HIT_MINUTES_PER_BOUT
  if (ruleSet.timeLimitSeconds !== null) return ruleSet.timeLimitSeconds / 60 + POINTS_MINUTES_OVER_TIME_LIMIT
  return POINTS_OPEN_MINUTES
}
