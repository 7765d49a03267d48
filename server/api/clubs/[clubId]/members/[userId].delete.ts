import { and, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, userId } = validParams(event, memberParams)
  await requireClubRole(event, clubId, ['admin'])
  const m = schema.memberships
  await changeMembership(clubId, userId, tx => tx.delete(m).where(and(eq(m.clubId, clubId), eq(m.userId, userId))))
  setResponseStatus(event, 204)
  return null
})
