import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import type { Role } from '#shared/utils/roles'

// Opening a sealed session cookie takes about a millisecond of crypto; the ring desk sends the
// same cookie with every bout. The user id inside a given sealed value never changes, so it is
// kept for a short while, keyed by the value itself.
const SESSION_MEMORY_MS = 30_000
const SESSION_MEMORY_SIZE = 1000
const openedSessions = new Map<string, { id: unknown, at: number }>()

/** The signed-in user's id from the session cookie, or undefined. */
async function sessionUserId(event: H3Event): Promise<unknown> {
  const sealed = getCookie(event, useRuntimeConfig().session?.name ?? 'nuxt-session')
  const now = Date.now()
  const known = sealed ? openedSessions.get(sealed) : undefined
  if (known && now - known.at < SESSION_MEMORY_MS) return known.id
  const id = (await getUserSession(event)).user?.id
  if (sealed && id !== undefined) {
    if (openedSessions.size >= SESSION_MEMORY_SIZE) openedSessions.delete(openedSessions.keys().next().value!)
    openedSessions.set(sealed, { id, at: now })
  }
  return id
}

/** 401; a session whose user is gone is cleared on the way. */
async function signInFirst(event: H3Event, id: unknown): Promise<never> {
  if (id !== undefined) await clearUserSession(event)
  throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'Sign in first' })
}

/** The signed-in user, re-read from the database so that a removed account loses access at once. */
export async function requireUser(event: H3Event) {
  const id = await sessionUserId(event)
  const [user] = typeof id === 'number'
    ? await useDb().select({ id: schema.users.id, email: schema.users.email, name: schema.users.name })
        .from(schema.users).where(eq(schema.users.id, id))
    : []
  return user ?? signInFirst(event, id)
}

const USER_IN_CLUB = {
  name: 'auth_user_in_club',
  text: 'select u.id, u.email, u.name, m.roles from users u left join memberships m on m.user_id = u.id and m.club_id = $2 where u.id = $1',
}

/**
 * The one gate for club data. Not a member: 404 (the club's private side is not revealed);
 * a member without any of the wanted roles: 403. An empty `roles` list admits every member.
 */
export async function requireClubRole(event: H3Event, clubId: number, roles: readonly Role[]) {
  const id = await sessionUserId(event)
  // The user and their membership in one prepared statement: every club route (the ring desk's too) waits on it.
  const [row] = typeof id === 'number' ? await rawQuery<{ id: number, email: string, name: string, roles: Role[] | null }>(useDb(), { ...USER_IN_CLUB, values: [id, clubId] }) : []
  if (!row) return signInFirst(event, id)
  const { roles: memberRoles, ...user } = row
  if (memberRoles === null) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Club not found' })
  const membership = { clubId, userId: user.id, roles: memberRoles }
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
