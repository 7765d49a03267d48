import { and, asc, eq, inArray, isNotNull, or } from 'drizzle-orm'
import type { Side } from '#shared/rules'
import { MAX_ROUND_ROBIN_FINALISTS } from '#shared/schemas/tournament'
import { advance, bracketPlaces, buildBracket, openFinalMatches, roundRobinFinal } from '#shared/tournament'
import type { Bracket, BracketPlaces } from '#shared/tournament'
import type { DbTx } from './events'

// The finals: built from the pools' overall ranking as the tournament enters them, fenced as an
// elimination bracket or as a round robin of the finalists, and settled match by match.

type Tournament = typeof schema.tournaments.$inferSelect
type Match = typeof schema.matches.$inferSelect

const roundRobinKey = (n: number) => `rr${n}`

/** Matches in the order a bracket is fenced: round by round, the bronze match before the final. */
export function bracketOrder(bracket: Bracket): string[] {
  return [...bracket.matches]
    .sort((a, b) => a.round - b.round || (a.kind === b.kind ? a.slot - b.slot : a.kind === 'bronze' ? -1 : 1))
    .map(m => m.id)
}

/** The final matches to create for a new bracket: every slot but the byes, the known sides filled. */
export function bracketMatchRows(tournamentId: number, bracket: Bracket): (typeof schema.matches.$inferInsert)[] {
  const order = bracketOrder(bracket)
  return bracket.matches
    .filter(m => m.status !== 'bye')
    .map(m => ({
      tournamentId,
      poolId: null,
      stage: 'final' as const,
      bracketMatchKey: m.id,
      orderInPool: order.indexOf(m.id) + 1,
      sideAEntry: m.sides[0].fighterId,
      sideBEntry: m.sides[1].fighterId,
    }))
}

/**
 * Draws the finals as the tournament enters them, in the phase change's transaction (the
 * tournament row is locked): the finalists by the overall ranking, then a bracket (with a bronze
 * match when the tournament wants one and there are semifinals) or a round robin in the order
 * of the pool tables. A tournament that never drew pools goes to its finals without either.
 */
export async function startFinals(tx: DbTx, tournament: Tournament) {
  const loaded = await loadPools(tx, tournament.id)
  if (loaded.length === 0) return
  const tables = await tournamentTables(tx, tournament, loaded)
  if (!tables.overall.complete) {
    const n = tables.overall.pendingMatches
    throw fieldError(409, 'to', `${n} pool ${n === 1 ? 'match is' : 'matches are'} still to be fenced or settled before the finals`)
  }
  const field = finalists(tables)
  if (field.length < 2) {
    throw fieldError(409, 'to', `The finals need at least 2 qualified fighters; ${field.length} ${field.length === 1 ? 'qualifies' : 'qualify'}`)
  }
  if (tournament.finalsFormat === 'round-robin') {
    if (field.length > MAX_ROUND_ROBIN_FINALISTS) {
      throw fieldError(409, 'to', `${field.length} fighters qualify, too many for a round-robin final (at most ${MAX_ROUND_ROBIN_FINALISTS}); lower the number who reach the finals or choose a bracket`)
    }
    await tx.insert(schema.brackets).values({ tournamentId: tournament.id, format: 'round-robin', state: null, field })
    await tx.insert(schema.matches).values(roundRobinFinal(field).map(([a, b], i) => ({
      tournamentId: tournament.id,
      poolId: null,
      stage: 'final' as const,
      bracketMatchKey: roundRobinKey(i + 1),
      orderInPool: i + 1,
      sideAEntry: a,
      sideBEntry: b,
    })))
    return
  }
  const bracket = buildBracket(field, { bronze: tournament.bronzeMatch && field.length >= 4 })
  await tx.insert(schema.brackets).values({ tournamentId: tournament.id, format: 'bracket', state: bracket, field })
  await tx.insert(schema.matches).values(bracketMatchRows(tournament.id, bracket))
}

/** Records that `side` forfeits a match, e.g. for a withdrawn fighter; the log keeps what was recorded. */
export async function forfeitMatch(tx: DbTx, match: Match, side: Side, reason: string) {
  const [updated] = await tx.update(schema.matches).set({
    status: 'forfeit',
    forfeitedBy: side,
    forfeitReason: reason,
    version: match.version + 1,
    finishedAt: new Date(),
  }).where(eq(schema.matches.id, match.id)).returning()
  return updated!
}

/** The reason shown on a final match forfeited because a fighter withdrew. */
function withdrawalForfeit(reason: string | null) {
  return `Withdrawn${reason ? `: ${reason}` : ''}`
}

/**
 * Moves the winner of a decided bracket match on (and a semifinal loser to the bronze match), in
 * the caller's transaction, filling the sides of the matches they go to. A match that now faces a
 * withdrawn fighter is forfeited by them at once, so the bracket never waits for someone who left.
 */
export async function advanceFinal(tx: DbTx, tournamentId: number, match: Match, winner: Side) {
  const b = schema.brackets
  const [row] = await tx.select().from(b).where(eq(b.tournamentId, tournamentId)).for('update')
  if (!row?.state || match.bracketMatchKey === null) return
  const winnerEntry = winner === 'a' ? match.sideAEntry : match.sideBEntry
  const next = advance(row.state, match.bracketMatchKey, winnerEntry!)
  await tx.update(b).set({ state: next }).where(eq(b.tournamentId, tournamentId))
  const decided = next.matches.find(m => m.id === match.bracketMatchKey)!
  const m = schema.matches
  for (const link of [decided.winnerTo, decided.loserTo]) {
    if (!link) continue
    const target = next.matches.find(x => x.id === link.matchId)!
    const [filled] = await tx.update(m).set({ sideAEntry: target.sides[0].fighterId, sideBEntry: target.sides[1].fighterId })
      .where(and(eq(m.tournamentId, tournamentId), eq(m.bracketMatchKey, link.matchId))).returning()
    if (filled) await forfeitIfWithdrawn(tx, tournamentId, filled)
  }
}

async function forfeitIfWithdrawn(tx: DbTx, tournamentId: number, match: Match) {
  if (match.sideAEntry === null || match.sideBEntry === null || match.status !== 'scheduled') return
  const n = schema.entries
  const gone = await tx.select({ id: n.id, reason: n.withdrawalReason }).from(n)
    .where(and(inArray(n.id, [match.sideAEntry, match.sideBEntry]), eq(n.status, 'withdrawn')))
  const quitter = gone.find(g => g.id === match.sideAEntry) ?? gone.find(g => g.id === match.sideBEntry)
  if (!quitter) return
  const side: Side = quitter.id === match.sideAEntry ? 'a' : 'b'
  const updated = await forfeitMatch(tx, match, side, withdrawalForfeit(quitter.reason))
  await advanceFinal(tx, tournamentId, updated, side === 'a' ? 'b' : 'a')
}

/**
 * A fighter withdrew during the finals: every final match of theirs that is not over and whose
 * opponent is known is forfeited, and the bracket moves on. Matches not yet filled are forfeited
 * when the fighter would reach them.
 */
export async function forfeitWithdrawnFinals(tx: DbTx, tournamentId: number, entryId: number, reason: string) {
  const m = schema.matches
  const open = await tx.select().from(m).where(and(
    eq(m.tournamentId, tournamentId),
    eq(m.stage, 'final'),
    inArray(m.status, ['scheduled', 'under-way']),
    isNotNull(m.sideAEntry),
    isNotNull(m.sideBEntry),
    or(eq(m.sideAEntry, entryId), eq(m.sideBEntry, entryId)),
  )).orderBy(asc(m.orderInPool)).for('update')
  for (const match of open) {
    const side: Side = match.sideAEntry === entryId ? 'a' : 'b'
    const updated = await forfeitMatch(tx, match, side, withdrawalForfeit(reason))
    await advanceFinal(tx, tournamentId, updated, side === 'a' ? 'b' : 'a')
  }
}

/** Places of a finished round robin: its table from the top. */
function roundRobinPlaces(rows: readonly { fighter: { entryId: number } }[], complete: boolean): BracketPlaces {
  if (!complete) return { first: null, second: null, third: [], fourth: null }
  const at = (i: number) => rows[i]?.fighter.entryId ?? null
  const third = at(2)
  return { first: at(0), second: at(1), third: third === null ? [] : [third], fourth: at(3) }
}

/**
 * The finals as the pages show them: the format, the finalists best first, the bracket or the
 * round robin's table, the matches in the order they are fenced and the places so far; empty
 * before the finals. `complete` says every final match is settled. Must run in a transaction:
 * a finished round robin may record its lot.
 */
export async function finalsView(tx: DbTx, tournament: Tournament) {
  const [row] = await tx.select().from(schema.brackets).where(eq(schema.brackets.tournamentId, tournament.id))
  if (!row) return { format: null, field: [], bracket: null, table: null, places: null, matches: [], complete: false }
  const m = schema.matches
  const rows = await tx.select().from(m)
    .where(and(eq(m.tournamentId, tournament.id), eq(m.stage, 'final'))).orderBy(asc(m.orderInPool))
  const matches = await matchSummaries(tx, tournament, rows)
  const settled = openFinalMatches(row.format, matches).length === 0
  if (row.format === 'round-robin') {
    const table = await finalTable(tx, tournament, row.field, rows)
    const complete = table.complete && settled
    return { format: row.format, field: row.field, bracket: null, table, places: roundRobinPlaces(table.rows, complete), matches, complete }
  }
  const places = bracketPlaces(row.state!)
  return { format: row.format, field: row.field, bracket: row.state, table: null, places, matches, complete: settled && places.first !== null }
}

export type FinalsView = Awaited<ReturnType<typeof finalsView>>
