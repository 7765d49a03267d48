import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, eventId } = validParams(event, eventParams)
  await requireClubRole(event, clubId, ['organizer'])
  const db = useDb()
  await findEvent(db, clubId, eventId)
  const [row] = await db.update(schema.events).set({ published: false, publishedAt: null })
    .where(eq(schema.events.id, eventId)).returning()
  return { ...eventView(row!), tournaments: await tournamentsOf(db, [eventId]) }
})
