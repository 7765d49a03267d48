import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { idParamSchema, slugSchema } from '#shared/schemas/club'
import type { FighterRef, MatchSummary } from '~~/server/utils/matches'
import type { StandingRowView } from '~~/server/utils/standings'

const params = z.object({ clubSlug: slugSchema, eventSlug: slugSchema, tournamentId: idParamSchema })

type Side = { entryId: number, name: string, clubName: string } | null
const side = (ref: FighterRef | null): Side => (ref ? { entryId: ref.entryId, name: ref.name, clubName: ref.clubName } : null)

function publicMatch(match: MatchSummary) {
  return {
    id: match.id,
    poolId: match.poolId,
    stage: match.stage,
    bracketKey: match.bracketKey,
    order: match.order,
    sideA: side(match.sideA),
    sideB: side(match.sideB),
    status: match.status,
    score: match.score,
    bouts: match.bouts,
    winner: match.winner,
    finishedReason: match.finishedReason,
  }
}

function publicRow(row: StandingRowView) {
  const { fighter, cards: _cards, ...numbers } = row
  return { ...numbers, fighter: { entryId: fighter.entryId, name: fighter.name, clubName: fighter.clubName } }
}

/**
 * A tournament of a published event for the club site: pools with their fighters (names and
 * clubs only), the tables with survival rates, and the bracket. An unpublished event is not found.
 */
export default defineEventHandler(async (event) => {
  const { clubSlug, eventSlug, tournamentId } = validParams(event, params)
  return useDb().transaction(async (tx) => {
    const t = schema.tournaments
    const [row] = await tx.select({ tournament: t, event: schema.events }).from(t)
      .innerJoin(schema.events, eq(schema.events.id, t.eventId))
      .innerJoin(schema.clubs, eq(schema.clubs.id, schema.events.clubId))
      .where(and(eq(t.id, tournamentId), eq(schema.clubs.slug, clubSlug), eq(schema.events.slug, eventSlug), eq(schema.events.published, true)))
    if (!row) throw notFoundError('Tournament')
    const { tournament } = row
    const loaded = tournament.phase === 'entries' ? [] : await loadPools(tx, tournament.id)
    const pools = await poolViews(tx, tournament)
    const tables = loaded.length === 0 ? null : await tournamentTables(tx, tournament, loaded)
    const finals = await finalsView(tx, tournament)
    return {
      event: publicEventSummary(row.event),
      tournament: { id: tournament.id, name: tournament.name, weapon: tournament.weapon, phase: tournament.phase },
      pools: pools.map(pool => ({
        id: pool.id,
        number: pool.number,
        ringNumber: pool.ringNumber,
        fighters: pool.fighters.map(f => ({ entryId: f.entryId, position: f.position, name: f.name, clubName: f.clubName, status: f.status })),
        matches: pool.matches.map(publicMatch),
      })),
      standings: tables && {
        pools: tables.pools.map(p => ({ poolId: p.poolId, number: p.number, complete: p.complete, rows: p.rows.map(publicRow) })),
        overall: { complete: tables.overall.complete, rows: tables.overall.rows.map(publicRow) },
        cut: tables.cut,
      },
      finals: finals.format && {
        format: finals.format,
        bracket: finals.bracket,
        table: finals.table && { complete: finals.table.complete, rows: finals.table.rows.map(publicRow) },
        places: finals.places,
        matches: finals.matches.map(publicMatch),
      },
    }
  })
})
