import { and, eq } from 'drizzle-orm'
import { markKindOrderSchema } from '#shared/schemas/marks'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, MARK_KIND_ROLES)
  const { ids } = await validBody(event, markKindOrderSchema)
  const k = schema.markKinds
  const db = useDb()
  await db.transaction(async (tx) => {
    await tx.select({ id: schema.clubs.id }).from(schema.clubs).where(eq(schema.clubs.id, clubId)).for('update')
    const kinds = await clubMarkKinds(tx, clubId)
    const known = new Set(kinds.map(kind => kind.id))
    if (ids.length !== known.size || ids.some(id => !known.has(id))) {
      throw fieldError(400, 'ids', 'List every one of the club’s kinds once, in the new order')
    }
    for (const [position, id] of ids.entries()) {
      await tx.update(k).set({ position }).where(and(eq(k.id, id), eq(k.clubId, clubId)))
    }
  })
  return markKindsView(db, clubId)
})
