import { desc, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, [])
  const db = useDb()
  const rows = await db.select().from(schema.events).where(eq(schema.events.clubId, clubId))
    .orderBy(desc(schema.events.startsOn), schema.events.name)
  const tournaments = await tournamentsOf(db, rows.map(row => row.id))
  return { events: rows.map(row => ({ ...eventView(row), tournaments: tournaments.filter(t => t.eventId === row.id) })) }
})
