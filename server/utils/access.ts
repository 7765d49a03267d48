import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import type { Role } from '#shared/utils/roles'

/** The signed-in user, re-read from the database so that a removed account loses access at once. */
export async function requireUser(event: H3Event) {
  const session = await getUserSession(event)
  const id = session.user?.id
  const [user] = typeof id === 'number'
    ? await useDb().select({ id: schema.users.id, email: schema.users.email, name: schema.users.name })
        .from(schema.users).where(eq(schema.users.id, id))
    : []
  if (!user) {
    if (id !== undefined) await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'Sign in first' })
  }
  return user
}

/**
 * The one gate for club data. Not a member: 404 (the club's private side is not revealed);
 * a member without any of the wanted roles: 403. An empty `roles` list admits every member.
 */
export async function requireClubRole(event: H3Event, clubId: number, roles: readonly Role[]) {
  const user = await requireUser(event)
  const [membership] = await useDb().select().from(schema.memberships)
    .where(and(eq(schema.memberships.clubId, clubId), eq(schema.memberships.userId, user.id)))
  if (!membership) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Club not found' })
  if (roles.length > 0 && !hasAnyRole(membership.roles, roles)) {
    const names = roles.map(role => ROLE_LABELS[role]).join(' or ')
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `This needs the ${names} role` })
  }
  return { user, membership }
}

/** Signs the user in: the session carries identity only; roles are always read from the database. */
export async function startSession(event: H3Event, user: { id: number, email: string, name: string }) {
  await replaceUserSession(event, { user: { id: user.id, email: user.email, name: user.name }, loggedInAt: Date.now() })
}
