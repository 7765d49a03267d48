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

export function payloads(log: readonly StoredEntry[]): MatchEntry[] {
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

/**
 * The tournament of a match route, held with a share lock until the transaction ends: matches
 * of one tournament are recorded side by side, while a draw, a move or a phase change (which
 * take the row for update) waits for them, and they for it.
 */
export async function shareTournament(db: DbTx, ids: { clubId: number, eventId: number, tournamentId: number }) {
  const t = schema.tournaments
  const e = schema.events
  const [row] = await db.select({ tournament: t, event: e }).from(t).innerJoin(e, eq(e.id, t.eventId))
    .where(and(eq(t.id, ids.tournamentId), eq(t.eventId, ids.eventId), eq(e.clubId, ids.clubId)))
    .for('share', { of: t })
  if (!row) throw notFoundError('Tournament')
  return row
}

/** A match of the tournament; with `lock`, its row is held until the transaction ends. */
export async function findMatch(db: DbTx, tournamentId: number, matchId: number, options: { lock?: boolean } = {}) {
  const m = schema.matches
  const query = db.select().from(m).where(and(eq(m.id, matchId), eq(m.tournamentId, tournamentId)))
  const [match] = options.lock ? await query.for('update') : await query
  if (!match) throw notFoundError('Match')
  return match
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

/**
 * Appends entries to a locked match: ids it already holds (or repeated in the request) are
 * duplicates and skipped; every new entry must be accepted by the engine on the state before it;
 * nothing is stored when any one is refused. A finished final match moves its winner on.
 */
export async function appendEntries(
  tx: DbTx,
  tournament: Tournament,
  match: Match,
  input: { expectedVersion: number, entries: MatchEntry[] },
  userId: number,
): Promise<AppendResult> {
  const ruleSet = rulesOf(tournament)
  const refs = await fighterRefs(tx, tournament.id)
  const log = (await matchLogs(tx, [match.id])).get(match.id)!
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
    return { match: matchSummary(match, refs, before), state: before, stored: [], duplicates }
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
  await tx.insert(schema.matchEntries).values(fresh.map(({ entry }, k) => ({
    id: entry.id,
    matchId: match.id,
    seq: log.length + k + 1,
    payload: entry,
    recordedBy: userId,
    recordedAt: now,
  })))
  const [updated] = await tx.update(schema.matches).set({
    version: match.version + 1,
    status: state.finished ? 'finished' : 'under-way',
    startedAt: match.startedAt ?? now,
    finishedAt: state.finished ? now : null,
  }).where(eq(schema.matches.id, match.id)).returning()
  if (state.finished && match.stage === 'final' && (state.result === 'a' || state.result === 'b')) {
    await advanceFinal(tx, tournament.id, updated!, state.result)
  }
  await publishMatch(tx, tournament, updated!, refs, entries, state)
  return { match: matchSummary(updated!, refs, state), state, stored: fresh.map(f => f.entry.id), duplicates }
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
