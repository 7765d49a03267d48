import { and, eq } from 'drizzle-orm'
import { memberRolesSchema } from '#shared/schemas/club'

export default defineEventHandler(async (event) => {
  const { clubId, userId } = validParams(event, memberParams)
  await requireClubRole(event, clubId, ['admin'])
  const { roles } = await validBody(event, memberRolesSchema)
  const m = schema.memberships
  const updated = await changeMembership(clubId, userId, async (tx) => {
    const [row] = await tx.update(m).set({ roles: normaliseRoles(roles) })
      .where(and(eq(m.clubId, clubId), eq(m.userId, userId))).returning()
    return row!
  })
  return { userId: updated.userId, roles: updated.roles }
})
