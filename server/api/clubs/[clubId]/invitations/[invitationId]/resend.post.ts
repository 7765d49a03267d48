import { and, eq, isNull } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, invitationId } = validParams(event, invitationParams)
  await requireClubRole(event, clubId, ['admin'])
  const db = useDb()
  const t = schema.invitations
  const { token, hash } = newToken()
  // A new token replaces the old hash, so the link in the earlier message stops working.
  const [invitation] = await db.update(t)
    .set({ tokenHash: hash, expiresAt: new Date(Date.now() + INVITATION_TTL_MS) })
    .where(and(eq(t.id, invitationId), eq(t.clubId, clubId), isNull(t.acceptedAt), isNull(t.revokedAt)))
    .returning()
  if (!invitation) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Invitation not found' })
  const [club] = await db.select().from(schema.clubs).where(eq(schema.clubs.id, clubId))
  await sendInvitationMail(invitation.email, club!.name, invitation.roles.filter(isRole), token)
  return { invitation: invitationView(invitation) }
})
