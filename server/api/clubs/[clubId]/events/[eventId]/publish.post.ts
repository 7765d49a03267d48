import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, eventId } = validParams(event, eventParams)
  await requireClubRole(event, clubId, ['organizer'])
  const db = useDb()
  const updated = await db.transaction(async (tx) => {
    const current = await findEvent(tx, clubId, eventId, { lock: true })
    // The public page carries the safety notice; it is not published without its two facts.
    if (!current.emergencyNumber) throw fieldError(400, 'emergencyNumber', 'Enter the emergency number for the safety notice before publishing')
    if (!current.firstAidPoint) throw fieldError(400, 'firstAidPoint', 'Say where first aid is on site before publishing')
    if (current.published) return current
    const [row] = await tx.update(schema.events).set({ published: true, publishedAt: new Date() })
      .where(eq(schema.events.id, eventId)).returning()
    return row!
  })
  return { ...eventView(updated), tournaments: await tournamentsOf(db, [eventId]) }
})
