import { and, count, eq, ne } from 'drizzle-orm'
import { clubProfileSchema } from '#shared/schemas/club'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  const { membership } = await requireClubRole(event, clubId, ['admin'])
  const input = await validBody(event, clubProfileSchema)
  const db = useDb()
  const [taken] = await db.select({ id: schema.clubs.id }).from(schema.clubs)
    .where(and(eq(schema.clubs.slug, input.slug), ne(schema.clubs.id, clubId)))
  if (taken) throw fieldError(409, 'slug', 'Another club already uses this address')
  const [club] = await db.update(schema.clubs).set(input).where(eq(schema.clubs.id, clubId)).returning()
    .catch((err: unknown) => {
      // Two admins renaming at once: the unique index decides, and the loser gets the same answer.
      if (isUniqueViolation(err)) throw fieldError(409, 'slug', 'Another club already uses this address')
      throw err
    })
  if (!club) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Club not found' })
  const [members] = await db.select({ n: count() }).from(schema.memberships).where(eq(schema.memberships.clubId, clubId))
  return privateClub(club, membership.roles, members?.n ?? 0)
})
