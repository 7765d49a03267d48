import { and, eq, isNull } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, invitationId } = validParams(event, invitationParams)
  await requireClubRole(event, clubId, ['admin'])
  const t = schema.invitations
  const [revoked] = await useDb().update(t).set({ revokedAt: new Date() })
    .where(and(eq(t.id, invitationId), eq(t.clubId, clubId), isNull(t.acceptedAt), isNull(t.revokedAt)))
    .returning({ id: t.id })
  if (!revoked) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Invitation not found' })
  setResponseStatus(event, 204)
  return null
})
