import { and, asc, eq } from 'drizzle-orm'
import { z } from 'zod'
import { idParamSchema } from '#shared/schemas/club'

const query = z.object({
  poolId: idParamSchema.optional(),
  stage: z.enum(schema.MATCH_STAGES, { error: `Use one of: ${schema.MATCH_STAGES.join(', ')}` }).optional(),
}).strict()

/** The tournament's matches: pool matches pool by pool in bout order, then the finals in bracket order. */
export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, [])
  const { poolId, stage } = validQuery(event, query)
  const db = useDb()
  const { tournament } = await findTournament(db, ids)
  const p = schema.pools
  const poolNumbers = new Map((await db.select({ id: p.id, number: p.number }).from(p).where(eq(p.tournamentId, tournament.id)))
    .map(row => [row.id, row.number]))
  if (poolId !== undefined && !poolNumbers.has(poolId)) throw poolNotFound()
  const m = schema.matches
  const rows = await db.select().from(m).where(and(
    eq(m.tournamentId, tournament.id),
    poolId === undefined ? undefined : eq(m.poolId, poolId),
    stage === undefined ? undefined : eq(m.stage, stage),
  )).orderBy(asc(m.orderInPool), asc(m.id))
  rows.sort((x, y) => (x.stage === y.stage ? 0 : x.stage === 'pool' ? -1 : 1)
    || (poolNumbers.get(x.poolId ?? 0) ?? 0) - (poolNumbers.get(y.poolId ?? 0) ?? 0)
    || (x.orderInPool ?? 0) - (y.orderInPool ?? 0))
  return { matches: await matchSummaries(db, tournament, rows) }
})
