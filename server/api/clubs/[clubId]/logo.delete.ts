import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, ['admin'])
  const db = useDb()
  const [club] = await db.select().from(schema.clubs).where(eq(schema.clubs.id, clubId))
  if (!club) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Club not found' })
  await db.update(schema.clubs).set({ logoKey: null }).where(eq(schema.clubs.id, clubId))
  if (club.logoKey) await deleteObject(club.logoKey).catch(() => {})
  setResponseStatus(event, 204)
  return null
})
