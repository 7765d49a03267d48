import { and, desc, eq, isNull } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, ['admin'])
  const db = useDb()
  const members = await db.select({
    userId: schema.users.id,
    name: schema.users.name,
    email: schema.users.email,
    roles: schema.memberships.roles,
    joinedAt: schema.memberships.createdAt,
  }).from(schema.memberships)
    .innerJoin(schema.users, eq(schema.users.id, schema.memberships.userId))
    .where(eq(schema.memberships.clubId, clubId))
    .orderBy(schema.users.name)
  const t = schema.invitations
  const invitations = await db.select().from(t)
    .where(and(eq(t.clubId, clubId), isNull(t.acceptedAt), isNull(t.revokedAt)))
    .orderBy(desc(t.createdAt))
  return { members, invitations: invitations.map(invitationView) }
})
