import { and, asc, eq, inArray, isNotNull } from 'drizzle-orm'
import { deriveMatch } from '#shared/rules'
import type { LiveBracketMatch, LiveCard, LiveFighter, LiveFinals, LiveMatch, LivePool, LiveRecord, RingLive } from '#shared/live/types'
import type { DbTx } from './events'
import type { FighterRef } from './matches'
import type { FinalsView } from './finals'
import type { StandingRowView, TournamentTables } from './standings'

// A ring's whole live state, made after every change by the publisher (server/utils/liveHub.ts)
// and by the routes that show a ring: the match on it, the last one that ended, what comes next,
// the live table of its pool and the finals. Derived from the logs like every other view.

type Tournament = typeof schema.tournaments.$inferSelect
type Match = typeof schema.matches.$inferSelect
type Pool = typeof schema.pools.$inferSelect

const fighterOf = (refs: ReadonlyMap<number, FighterRef>, entryId: number | null): LiveFighter | null => {
  const ref = entryId === null ? undefined : refs.get(entryId)
  return ref ? { entryId: ref.entryId, name: ref.name, clubName: ref.clubName } : null
}

function record(row: StandingRowView, need: number | null): LiveRecord {
  return {
    entryId: row.fighter.entryId,
    name: row.fighter.name,
    clubName: row.fighter.clubName,
    rank: row.rank,
    wins: row.wins,
    losses: row.losses,
    draws: row.draws,
    matchesFought: row.matchesFought,
    unharmed: row.unharmed,
    boutsFought: row.boutsFought,
    survivalRate: row.survivalRate,
    indicator: row.indicator,
    status: row.status,
    need,
  }
}

function livePool(tournament: Tournament, pool: Pool, tables: TournamentTables): LivePool | null {
  const table = tables.pools.find(p => p.poolId === pool.id)
  if (!table) return null
  const needs = new Map(tables.qualification.fighters.map(f => [f.fighter.entryId, f.survival?.need ?? null]))
  return {
    tournamentId: tournament.id,
    tournamentName: tournament.name,
    poolNumber: pool.number,
    complete: table.complete,
    rows: table.rows.map(row => record(row, row.status === 'secured' ? 0 : needs.get(row.fighter.entryId) ?? null)),
    cut: { topN: tables.cut.topN, minSurvivalRate: tables.cut.minSurvivalRate },
  }
}

function liveFinals(tournament: Tournament, view: FinalsView, refs: ReadonlyMap<number, FighterRef>): LiveFinals | null {
  if (view.format === null) return null
  const byKey = new Map(view.matches.map(m => [m.bracketKey, m]))
  const matches: LiveBracketMatch[] = view.bracket
    ? view.bracket.matches.map((slot): LiveBracketMatch => {
        const played = byKey.get(slot.id)
        const status: LiveBracketMatch['status'] = slot.status === 'bye' || slot.status === 'done' || slot.status === 'waiting'
          ? slot.status
          : played?.status === 'under-way' ? 'under-way' : 'ready'
        return {
          key: slot.id,
          round: slot.round,
          name: slot.name,
          sideA: fighterOf(refs, slot.sides[0].fighterId),
          sideB: fighterOf(refs, slot.sides[1].fighterId),
          score: played && played.status !== 'scheduled' ? played.score : null,
          winner: slot.winnerId === null ? null : slot.winnerId === slot.sides[0].fighterId ? 'a' as const : 'b' as const,
          status,
        }
      })
    : view.matches.map(m => ({
        key: m.bracketKey ?? String(m.id),
        round: 1,
        name: 'Round robin',
        sideA: fighterOf(refs, m.sideA?.entryId ?? null),
        sideB: fighterOf(refs, m.sideB?.entryId ?? null),
        score: m.status === 'scheduled' ? null : m.score,
        winner: m.winner === 'a' || m.winner === 'b' ? m.winner : null,
        status: m.status === 'finished' || m.status === 'forfeit' ? 'done' as const : m.status === 'under-way' ? 'under-way' as const : 'ready' as const,
      }))
  const places = view.places
  return {
    tournamentId: tournament.id,
    tournamentName: tournament.name,
    format: view.format,
    roundCount: view.bracket?.roundCount ?? 1,
    matches,
    table: view.table ? view.table.rows.map(row => record(row, null)) : [],
    places: {
      first: fighterOf(refs, places?.first ?? null),
      second: fighterOf(refs, places?.second ?? null),
      third: (places?.third ?? []).map(id => fighterOf(refs, id)).filter((f): f is LiveFighter => f !== null),
    },
  }
}

/** Matches in the order the schedule fences them: pools before finals, tournaments in order, pool by pool. */
function scheduleOrder(matches: Match[], tournamentOrder: Map<number, number>, poolNumber: Map<number, number>) {
  return [...matches].sort((x, y) => (x.stage === y.stage ? 0 : x.stage === 'pool' ? -1 : 1)
    || tournamentOrder.get(x.tournamentId)! - tournamentOrder.get(y.tournamentId)!
    || (poolNumber.get(x.poolId ?? 0) ?? 0) - (poolNumber.get(y.poolId ?? 0) ?? 0)
    || (x.orderInPool ?? 0) - (y.orderInPool ?? 0))
}

/** The ring's live state now. Must run in a transaction: a finished table may record its lot. */
export async function ringSnapshot(tx: DbTx, eventId: number, ring: number): Promise<RingLive> {
  const [event] = await tx.select().from(schema.events).where(eq(schema.events.id, eventId))
  if (!event) throw notFoundError('Event')
  const state = await ringState(tx, eventId, ring)
  const base: RingLive = {
    eventId,
    eventName: event.name,
    ring,
    seq: state.seq,
    at: new Date().toISOString(),
    board: { onAir: state.board, mode: state.boardMode },
    match: null,
    lastFinished: null,
    onDeck: null,
    next: null,
    pool: null,
    finals: null,
  }
  const t = schema.tournaments
  const started = await tx.select().from(t).where(and(eq(t.eventId, eventId), isNotNull(t.frozenRules))).orderBy(asc(t.id))
  if (started.length === 0) return base

  const ids = started.map(s => s.id)
  const pools = await tx.select().from(schema.pools).where(inArray(schema.pools.tournamentId, ids))
  const ringPools = new Map(pools.filter(p => ringOf(p.ringNumber, event.rings) === ring).map(p => [p.id, p]))
  const finalsHere = ringOf(null, event.rings) === ring
  const m = schema.matches
  const all = await tx.select().from(m).where(inArray(m.tournamentId, ids))
  const mine = scheduleOrder(
    all.filter(x => (x.poolId === null ? finalsHere : ringPools.has(x.poolId))),
    new Map(started.map((s, i) => [s.id, i])),
    new Map(pools.map(p => [p.id, p.number])),
  )
  const byTournament = new Map(started.map(s => [s.id, s]))

  const called = mine.find(x => x.id === state.currentMatchId)
  const underWay = mine.filter(x => x.status === 'under-way').sort((x, y) => (y.startedAt?.getTime() ?? 0) - (x.startedAt?.getTime() ?? 0))[0]
  const current = called ?? underWay ?? null
  const ended = mine.filter(x => (x.status === 'finished' || x.status === 'forfeit') && x.finishedAt !== null)
    .sort((x, y) => y.finishedAt!.getTime() - x.finishedAt!.getTime())[0] ?? null
  const pending = mine.filter(x => x.status === 'scheduled' && x.id !== current?.id && x.sideAEntry !== null && x.sideBEntry !== null)

  const refsCache = new Map<number, Map<number, FighterRef>>()
  const refsOf = async (tournamentId: number) => {
    let refs = refsCache.get(tournamentId)
    if (!refs) {
      refs = await fighterRefs(tx, tournamentId)
      refsCache.set(tournamentId, refs)
    }
    return refs
  }
  const logs = await matchLogs(tx, [current, ended].filter((x): x is Match => x !== null).map(x => x.id))
  const live = async (match: Match | null): Promise<LiveMatch | null> => {
    if (!match) return null
    const tournament = byTournament.get(match.tournamentId)!
    const log = payloads(logs.get(match.id) ?? [])
    const place = await matchPlace(tx, tournament, match, event.rings)
    return liveMatch({ tournament, ruleSet: rulesOf(tournament), ...place }, match, await refsOf(tournament.id), log, deriveMatch(rulesOf(tournament), log))
  }
  const card = async (match: Match | undefined): Promise<LiveCard | null> => {
    if (!match) return null
    const tournament = byTournament.get(match.tournamentId)!
    const refs = await refsOf(tournament.id)
    const place = await matchPlace(tx, tournament, match, event.rings)
    return {
      id: match.id,
      tournamentName: tournament.name,
      stage: match.stage,
      poolNumber: place.poolNumber,
      roundName: place.roundName,
      sideA: fighterOf(refs, match.sideAEntry),
      sideB: fighterOf(refs, match.sideBEntry),
      startsAt: null,
    }
  }

  // The pool and the finals the boards show: those of the match on the ring, else the last one, else the next.
  const focus = current ?? ended ?? pending[0] ?? null
  let pool: LivePool | null = null
  let finals: LiveFinals | null = null
  if (focus) {
    const tournament = byTournament.get(focus.tournamentId)!
    const focusPool = focus.poolId === null ? null : ringPools.get(focus.poolId) ?? null
    if (focusPool) {
      const tables = await tournamentTables(tx, tournament, await loadPools(tx, tournament.id))
      pool = livePool(tournament, focusPool, tables)
    }
    if (tournament.phase === 'finals' || tournament.phase === 'done') {
      finals = liveFinals(tournament, await finalsView(tx, tournament), await refsOf(tournament.id))
    }
  }

  return {
    ...base,
    match: await live(current),
    lastFinished: await live(ended),
    onDeck: await card(pending[0]),
    next: await card(pending[1]),
    pool,
    finals,
  }
}
