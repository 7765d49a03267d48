import { and, count, eq, gt, sql } from 'drizzle-orm'
import { resetRequestSchema } from '#shared/schemas/auth'

// Answers the same whether or not the account exists, so it cannot be used to find members.
export default defineEventHandler(async (event) => {
  const { email } = await validBody(event, resetRequestSchema)
  await assertSignInAllowed(event, email)
  const db = useDb()
  const [user] = await db.select().from(schema.users).where(sql`lower(${schema.users.email}) = ${email}`)
  // At most a few messages per account per window, so the form cannot be used to flood an inbox.
  const [recent] = user
    ? await db.select({ n: count() }).from(schema.passwordResets)
        .where(and(eq(schema.passwordResets.userId, user.id), gt(schema.passwordResets.createdAt, new Date(Date.now() - SIGN_IN_WINDOW_MS))))
    : []
  if (user && (recent?.n ?? 0) < MAX_RESETS_PER_WINDOW) {
    const { token, hash } = newToken()
    await db.insert(schema.passwordResets).values({ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + RESET_TTL_MS) })
    await sendMail({
      to: user.email,
      subject: 'Reset your Unscathed password',
      text: [
        `Hello ${user.name},`,
        '',
        'Someone asked to reset the password of your Unscathed account. To choose a new one, open:',
        appLink(`/reset-password/${token}`),
        '',
        'The link works once, for one hour. If you did not ask for this, ignore this message: your password stays as it is.',
      ].join('\n'),
    })
  }
  return { ok: true }
})
