import { and, eq, sql } from 'drizzle-orm'

// A new overlay address for the ring: the old one stops working at once, and overlays open with
// it are closed (in every app process, through the bus).
export default defineEventHandler(async (event) => {
  const ids = validParams(event, ringParams)
  await requireClubRole(event, ids.clubId, ['streamer', 'organizer', 'admin'])
  return useDb().transaction(async (tx) => {
    const row = await findRing(tx, ids)
    await ringState(tx, row.id, ids.ring, { lock: true })
    const r = schema.ringStates
    const [state] = await tx.update(r).set({
      overlayToken: sql`replace(gen_random_uuid()::text || gen_random_uuid()::text, '-', '')`,
      tokenRotatedAt: new Date(),
      updatedAt: new Date(),
    }).where(and(eq(r.eventId, row.id), eq(r.ringNumber, ids.ring))).returning()
    await tx.execute(sql`select pg_notify(${TOKEN_CHANNEL}, ${`${row.id}:${ids.ring}`})`)
    return { ring: ids.ring, overlay: { path: overlayPath(state!.overlayToken), rotatedAt: state!.tokenRotatedAt } }
  })
})
