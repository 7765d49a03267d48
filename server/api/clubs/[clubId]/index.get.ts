import { count, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  const { membership } = await requireClubRole(event, clubId, [])
  const db = useDb()
  const [club] = await db.select().from(schema.clubs).where(eq(schema.clubs.id, clubId))
  if (!club) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Club not found' })
  const [members] = await db.select({ n: count() }).from(schema.memberships).where(eq(schema.memberships.clubId, clubId))
  return privateClub(club, membership.roles, members?.n ?? 0)
})
