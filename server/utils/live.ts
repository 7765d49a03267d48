import { and, eq, sql } from 'drizzle-orm'
import type { RawQuery } from './rawSql'
import type { MatchEntry, MatchState, RuleSet } from '#shared/rules'
import type { LiveBout, LiveMatch, LiveMessage } from '#shared/live/types'
import type { DbTx } from './events'
import type { FighterRef, LockedMatch } from './matches'

// The writing side of the live bus. A change to a match sends the match's new state on its
// ring's stream in the same transaction (so the boards show a bout within milliseconds of the
// commit) and marks the ring for a new snapshot (standings, queue, bracket), which the
// publisher in server/utils/liveHub.ts makes right after. A ring's messages are numbered under
// its row lock, so they commit, and reach every app process through NOTIFY, in order.

type Tournament = typeof schema.tournaments.$inferSelect
type Match = typeof schema.matches.$inferSelect

/** A message before the bus numbers it. */
type Unsequenced = LiveMessage extends infer M ? M extends LiveMessage ? Omit<M, 'seq'> : never : never

export const LIVE_CHANNEL = 'unscathed_live'
export const DIRTY_CHANNEL = 'unscathed_live_dirty'
export const TOKEN_CHANNEL = 'unscathed_live_token'
// NOTIFY payloads must stay under 8000 bytes; a bigger message is read back from live_events.
export const NOTIFY_INLINE_LIMIT = 7000

/** The ring a match is fenced in: its pool's ring (the last ring if the event has fewer now), or the finals ring. */
export function ringOf(poolRing: number | null, eventRings: number): number {
  return Math.max(1, Math.min(poolRing ?? FINALS_RING, eventRings))
}

function bouts(state: MatchState, log: readonly MatchEntry[]): LiveBout[] {
  const out: LiveBout[] = []
  for (const item of state.timeline) {
    if (item.bout === null || item.hit === null) continue
    const entry = log[item.index]!
    const kind = entry.kind === 'afterblow' || entry.kind === 'double' ? entry.kind : 'clean'
    out.push({ n: item.bout, hit: item.hit, kind, by: entry.kind === 'clean' || entry.kind === 'afterblow' ? entry.side : null, points: item.points })
  }
  return out
}

function cards(side: MatchState['sides']['a']) {
  const c = side.cards
  return { warnings: c.warnings, yellows: c.yellows, reds: c.reds, black: c.black }
}

export interface LiveMatchContext {
  tournament: Pick<Tournament, 'id' | 'name' | 'weapon'>
  ruleSet: RuleSet
  poolNumber: number | null
  roundName: string | null
  ring: number
}

/** A match as the boards show it, from its row, its log and the state the rule engine derived from that log. */
export function liveMatch(ctx: LiveMatchContext, match: Match, refs: ReadonlyMap<number, FighterRef>, log: readonly MatchEntry[], state: MatchState): LiveMatch {
  const fighter = (entryId: number | null) => {
    const ref = entryId === null ? undefined : refs.get(entryId)
    return ref ? { entryId: ref.entryId, name: ref.name, clubName: ref.clubName } : { entryId: entryId ?? 0, name: 'To be decided', clubName: '' }
  }
  const { ruleSet } = ctx
  const forfeit = match.status === 'forfeit'
  const winner = forfeit ? (match.forfeitedBy === 'a' ? 'b' : 'a') : state.result === 'a' || state.result === 'b' ? state.result : null
  return {
    id: match.id,
    version: match.version,
    tournamentId: ctx.tournament.id,
    tournamentName: ctx.tournament.name,
    weapon: ctx.tournament.weapon,
    stage: match.stage,
    poolNumber: ctx.poolNumber,
    roundName: ctx.roundName,
    ring: ctx.ring,
    format: ruleSet.format,
    boutsPerMatch: ruleSet.format === 'first-hit' ? ruleSet.boutsPerMatch : null,
    pointsToWin: ruleSet.format === 'points' ? ruleSet.pointsToWin : null,
    sideA: fighter(match.sideAEntry),
    sideB: fighter(match.sideBEntry),
    status: match.status,
    score: { a: state.sides.a.points, b: state.sides.b.points },
    bouts: bouts(state, log),
    voids: state.voids,
    doubles: state.doubles,
    cards: { a: cards(state.sides.a), b: cards(state.sides.b) },
    unharmed: { a: state.sides.a.unharmedBouts, b: state.sides.b.unharmedBouts },
    fought: { a: state.bouts, b: state.bouts },
    finished: forfeit || state.finished,
    result: forfeit ? winner : state.result,
    endReason: forfeit ? 'forfeit' : state.endReason,
    winner,
    forfeitedBy: match.forfeitedBy,
    clock: ruleSet.format === 'points'
      ? {
          runningSince: match.clockRunningSince?.toISOString() ?? null,
          elapsedMs: match.clockElapsedMs,
          limitMs: ruleSet.timeLimitSeconds === null ? null : ruleSet.timeLimitSeconds * 1000,
        }
      : null,
    startedAt: match.startedAt?.toISOString() ?? null,
    finishedAt: match.finishedAt?.toISOString() ?? null,
  }
}

/** Where a match is fenced and what it is called: its pool's number and ring, or its round in the finals. */
export async function matchPlace(tx: DbTx, tournament: Tournament, match: Match, rings: number) {
  if (match.poolId !== null) {
    const [pool] = await tx.select({ number: schema.pools.number, ringNumber: schema.pools.ringNumber }).from(schema.pools).where(eq(schema.pools.id, match.poolId))
    return { poolNumber: pool?.number ?? null, roundName: null, ring: ringOf(pool?.ringNumber ?? 1, rings) }
  }
  return { poolNumber: null, roundName: await roundNameOf(tx, tournament.id, match), ring: ringOf(null, rings) }
}

// The bus's own part of a statement; `$n` are offset by the parameters of the caller's writes.
// With `gate` (a CTE of the caller's), the message is sent only when that CTE returns a row.
function liveText(at: number, gate?: string) {
  const p = (n: number) => `$${at + n}`
  return `r as (
      insert into ring_states (event_id, ring_number, seq) select ${p(1)}, ${p(2)}, 1${gate ? ` from ${gate}` : ''}
      on conflict (event_id, ring_number) do update set seq = ring_states.seq + 1, updated_at = now()
      returning seq
    ), e as (
      insert into live_events (event_id, ring_number, seq, kind, payload)
      select ${p(1)}, ${p(2)}, r.seq, ${p(3)}, jsonb_set(${p(4)}::jsonb, '{seq}', to_jsonb(r.seq)) from r
      returning seq, payload::text as body
    ), d as (
      insert into live_dirty (event_id, ring_number) select ${p(1)}, ${p(2)} from r where ${p(5)}::boolean
      on conflict (event_id, ring_number) do update set marked_at = clock_timestamp()
    )
    select e.seq,
      pg_notify('${LIVE_CHANNEL}', concat_ws(':', ${p(1)}::text, ${p(2)}::text, e.seq::text, ${p(3)}::text,
        case when length(e.body) < ${NOTIFY_INLINE_LIMIT} then e.body end)),
      case when ${p(5)}::boolean then pg_notify('${DIRTY_CHANNEL}', ${p(1)}::text || ':' || ${p(2)}::text) end
    from e`
}

const LIVE_ALONE = { name: 'live_publish', text: `with ${liveText(0)}` }

/**
 * Sends one message on a ring's stream inside the caller's transaction: numbers it under the
 * ring's row lock, stores it for clients that reconnect, marks the ring for a new snapshot and
 * notifies every app process, all in one statement. `before` puts the caller's own writes (CTEs
 * of a prepared statement) into the same statement, so a change and its message cost one round
 * trip. Returns the message's number.
 */
export async function publishLive(tx: DbTx, eventId: number, ring: number, message: Unsequenced, options: { dirty?: boolean, before?: RawQuery & { gate?: string } } = {}): Promise<number | null> {
  const values = [eventId, ring, message.kind, JSON.stringify(message), options.dirty ?? true]
  const { before } = options
  const query = before
    ? { name: `${before.name}_live`, text: `with ${before.text}, ${liveText(before.values.length, before.gate)}`, values: [...before.values, ...values] }
    : { ...LIVE_ALONE, values }
  const [row] = await rawQuery<{ seq: number }>(tx, query)
  // No row: the caller's gate let nothing through.
  return row ? Number(row.seq) : null
}

/** The name of a final match's round ("Semifinal", "Bronze match"), or "Round robin". */
async function roundNameOf(tx: DbTx, tournamentId: number, match: Match): Promise<string | null> {
  if (match.stage !== 'final') return null
  const [finals] = await tx.select({ format: schema.brackets.format, state: schema.brackets.state }).from(schema.brackets).where(eq(schema.brackets.tournamentId, tournamentId))
  if (finals?.format === 'round-robin') return 'Round robin'
  return finals?.state?.matches.find(m => m.id === match.bracketMatchKey)?.name ?? null
}

/** The match's new state on its ring's stream, in the caller's transaction (and statement, with `before`). */
export async function publishMatch(tx: DbTx, locked: LockedMatch, match: Match, log: readonly MatchEntry[], state: MatchState, before?: RawQuery & { gate?: string }) {
  const { tournament, place } = locked
  const ctx = { tournament, ruleSet: rulesOf(tournament), poolNumber: place.poolNumber, ring: place.ring, roundName: await roundNameOf(tx, tournament.id, match) }
  const live = liveMatch(ctx, match, locked.sides, log, state)
  const seq = await publishLive(tx, tournament.eventId, place.ring, { kind: 'match', ring: place.ring, match: live, at: new Date().toISOString() }, { before })
  return { live, sent: seq !== null }
}

/**
 * Marks rings for a new snapshot after a change that is not a single match (a draw, a phase
 * change, a withdrawal): every ring of the event, or the ones named.
 */
export async function markRingsDirty(tx: DbTx, eventId: number, rings?: readonly number[]) {
  const [event] = await tx.select({ rings: schema.events.rings }).from(schema.events).where(eq(schema.events.id, eventId))
  if (!event) return
  const list = rings ?? Array.from({ length: event.rings }, (_, i) => i + 1)
  if (list.length === 0) return
  // A mark already there moves on: a snapshot being made now may have read the data before this
  // change, and clears only the marks it has seen.
  const d = schema.liveDirty
  await tx.insert(d).values(list.map(ringNumber => ({ eventId, ringNumber })))
    .onConflictDoUpdate({ target: [d.eventId, d.ringNumber], set: { markedAt: sql`clock_timestamp()` } })
  await tx.execute(sql`select pg_notify(${DIRTY_CHANNEL}, ${`${eventId}:*`})`)
}

/** The ring's state row, made on first use. */
export async function ringState(tx: DbTx, eventId: number, ring: number, options: { lock?: boolean } = {}) {
  await tx.insert(schema.ringStates).values({ eventId, ringNumber: ring }).onConflictDoNothing()
  const r = schema.ringStates
  const query = tx.select().from(r).where(and(eq(r.eventId, eventId), eq(r.ringNumber, ring)))
  const [row] = options.lock ? await query.for('update') : await query
  return row!
}
