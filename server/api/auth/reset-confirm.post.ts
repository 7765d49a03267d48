import { and, eq, gt, isNull } from 'drizzle-orm'
import { resetConfirmSchema } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token, password } = await validBody(event, resetConfirmSchema)
  const passwordHash = await hashPassword(password)
  const db = useDb()
  const user = await db.transaction(async (tx) => {
    const t = schema.passwordResets
    // Marking the token used in the same statement that finds it makes it single-use under races.
    const [reset] = await tx.update(t).set({ usedAt: new Date() })
      .where(and(eq(t.tokenHash, hashToken(token)), isNull(t.usedAt), gt(t.expiresAt, new Date())))
      .returning()
    if (!reset) return null
    const [updated] = await tx.update(schema.users).set({ passwordHash }).where(eq(schema.users.id, reset.userId)).returning()
    return updated ?? null
  })
  if (!user) {
    throw fieldError(400, 'token', 'This link has expired or was already used')
  }
  await clearSignInFailures(user.email.toLowerCase())
  await startSession(event, user)
  return { user: { id: user.id, email: user.email, name: user.name } }
})
