import { eq } from 'drizzle-orm'
import { cardBatchSchema } from '#shared/schemas/cards'

/** Asks a worker for every card of a tournament in the chosen sizes, as one ZIP; answers the batch to follow. */
export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  const { user } = await requireClubRole(event, clubId, ['editor'])
  const body = await validBody(event, cardBatchSchema)
  const db = useDb()
  const { batch, tournament } = await db.transaction(async (tx) => {
    const { tournament } = await findCardTournament(tx, clubId, body.tournamentId)
    const [row] = await tx.insert(schema.cardBatches)
      .values({ clubId, tournamentId: body.tournamentId, sizes: body.sizes, requestedBy: user.id }).returning()
    return { batch: row!, tournament }
  })
  try {
    await enqueueJob('cards-batch', { batchId: batch.id })
  }
  catch (err) {
    await db.update(schema.cardBatches).set({ status: 'failed', error: 'The export could not be queued; try again' }).where(eq(schema.cardBatches.id, batch.id))
    throw err
  }
  setResponseStatus(event, 202)
  return { batch: cardBatchView(batch, tournament.name) }
})
