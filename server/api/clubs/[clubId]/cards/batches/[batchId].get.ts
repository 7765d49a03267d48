import { and, eq } from 'drizzle-orm'
import { idParamSchema } from '#shared/schemas/club'

const params = clubParams.extend({ batchId: idParamSchema })

/** A batch's progress, for the studio to poll. */
export default defineEventHandler(async (event) => {
  const { clubId, batchId } = validParams(event, params)
  await requireClubRole(event, clubId, ['editor'])
  const b = schema.cardBatches
  const [row] = await useDb().select({ batch: b, name: schema.tournaments.name }).from(b)
    .innerJoin(schema.tournaments, eq(schema.tournaments.id, b.tournamentId))
    .where(and(eq(b.id, batchId), eq(b.clubId, clubId)))
  if (!row) throw notFoundError('Export')
  return { batch: cardBatchView(row.batch, row.name) }
})
