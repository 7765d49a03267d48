import { z } from 'zod'
import { and, eq, gt, isNull } from 'drizzle-orm'
import { passwordSchema, tokenSchema, nameSchema } from '#shared/schemas/auth'

const params = z.object({ token: tokenSchema })
// An existing account only proves itself with its password; a new one also gives a name.
const body = z.object({ name: nameSchema.optional(), password: z.string().min(1, { error: 'Enter a password' }).max(200) }).strict()

export default defineEventHandler(async (event) => {
  const { token } = validParams(event, params)
  const input = await validBody(event, body)
  const found = await findOpenInvitation(token)
  if (!found) throw invitationGone()

  const existing = await findUserByEmail(found.invitation.email)
  let newHash: string | null = null
  if (existing) {
    if (!await verifyPassword(existing.passwordHash, input.password)) {
      throw fieldError(400, 'password', 'Enter the password of your existing account')
    }
  }
  else {
    if (!input.name) throw fieldError(400, 'name', 'Enter a name')
    const strong = passwordSchema.safeParse(input.password)
    if (!strong.success) throw fieldError(400, 'password', strong.error.issues[0]?.message ?? 'Choose another password')
    newHash = await hashPassword(input.password)
  }

  const db = useDb()
  const user = await db.transaction(async (tx) => {
    const t = schema.invitations
    const [claimed] = await tx.update(t).set({ acceptedAt: new Date() })
      .where(and(eq(t.id, found.invitation.id), isNull(t.acceptedAt), isNull(t.revokedAt), gt(t.expiresAt, new Date())))
      .returning()
    if (!claimed) return null
    const account = existing ?? (await tx.insert(schema.users)
      .values({ email: claimed.email, name: input.name!, passwordHash: newHash! })
      .returning())[0]!
    const roles = claimed.roles.filter(isRole)
    await tx.insert(schema.memberships).values({ clubId: claimed.clubId, userId: account.id, roles })
      .onConflictDoUpdate({
        target: [schema.memberships.clubId, schema.memberships.userId],
        set: { roles },
      })
    return account
  })
  if (!user) throw invitationGone()
  await startSession(event, user)
  return { user: { id: user.id, email: user.email, name: user.name }, club: { slug: found.club.slug } }
})
