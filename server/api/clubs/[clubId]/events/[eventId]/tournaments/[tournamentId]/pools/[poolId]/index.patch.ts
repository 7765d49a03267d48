import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { MAX_RINGS } from '#shared/schemas/tournament'

const poolPatchSchema = z.object({
  ringNumber: z.number({ error: 'Enter the ring number' }).int({ error: 'Use a whole number' })
    .min(1, { error: 'Rings are numbered from 1' }).max(MAX_RINGS, { error: `At most ${MAX_RINGS} rings` }),
}).strict()

export default defineEventHandler(async (event) => {
  const ids = validParams(event, poolParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  const { ringNumber } = await validBody(event, poolPatchSchema)
  return useDb().transaction(async (tx) => {
    const { tournament, event: row } = await findTournament(tx, ids, { lock: true })
    const p = schema.pools
    const [pool] = await tx.select().from(p).where(and(eq(p.id, ids.poolId), eq(p.tournamentId, tournament.id)))
    if (!pool) throw poolNotFound()
    requirePhase(tournament, ['pools'], 'moving a pool to another ring')
    if (ringNumber > row.rings) throw fieldError(400, 'ringNumber', `The event has ${row.rings} ${row.rings === 1 ? 'ring' : 'rings'}`)
    await tx.update(p).set({ ringNumber }).where(eq(p.id, pool.id))
    await markRingsDirty(tx, tournament.eventId)
    return (await poolViews(tx, tournament)).find(view => view.id === pool.id)!
  })
})
