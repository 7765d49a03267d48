import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const rows = await useDb().select({ club: schema.clubs, roles: schema.memberships.roles })
    .from(schema.memberships)
    .innerJoin(schema.clubs, eq(schema.clubs.id, schema.memberships.clubId))
    .where(eq(schema.memberships.userId, user.id))
    .orderBy(schema.clubs.name)
  return {
    user,
    clubs: rows.map(({ club, roles }) => ({
      id: club.id,
      slug: club.slug,
      name: club.name,
      roles,
      primaryColor: club.primaryColor,
      secondaryColor: club.secondaryColor,
      logoUrl: logoUrl(club),
    })),
  }
})
