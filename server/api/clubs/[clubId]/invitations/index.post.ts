import { and, eq, isNull } from 'drizzle-orm'
import { invitationSchema } from '#shared/schemas/club'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  const { user } = await requireClubRole(event, clubId, ['admin'])
  const { email, roles } = await validBody(event, invitationSchema)
  const db = useDb()
  const [club] = await db.select().from(schema.clubs).where(eq(schema.clubs.id, clubId))
  if (!club) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Club not found' })

  const existing = await findUserByEmail(email)
  if (existing) {
    const [member] = await db.select().from(schema.memberships)
      .where(and(eq(schema.memberships.clubId, clubId), eq(schema.memberships.userId, existing.id)))
    if (member) throw fieldError(409, 'email', 'This person is already a member; change their roles in the table')
  }

  const { token, hash } = newToken()
  const t = schema.invitations
  const invitation = await db.transaction(async (tx) => {
    // A newer invitation to the same address replaces the older ones, so only one link works.
    await tx.update(t).set({ revokedAt: new Date() })
      .where(and(eq(t.clubId, clubId), eq(t.email, email), isNull(t.acceptedAt), isNull(t.revokedAt)))
    const [row] = await tx.insert(t).values({
      clubId, email, roles: normaliseRoles(roles), tokenHash: hash, invitedBy: user.id,
      expiresAt: new Date(Date.now() + INVITATION_TTL_MS),
    }).returning()
    return row!
  })
  await sendInvitationMail(email, club.name, normaliseRoles(roles), token)
  setResponseStatus(event, 201)
  return { invitation: invitationView(invitation) }
})
