import { sql } from 'drizzle-orm'
import { signInSchema } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { email, password } = await validBody(event, signInSchema)
  const ip = clientAddress(event)
  await assertSignInAllowed(event, email)

  const [user] = await useDb().select().from(schema.users).where(sql`lower(${schema.users.email}) = ${email}`)
  // Verify against a real hash even for unknown e-mails so the answer time does not reveal accounts.
  const ok = await verifyPassword(user?.passwordHash ?? await dummyHash(), password)
  if (!user || !ok) {
    await recordSignInFailure(email, ip)
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'E-mail or password is wrong' })
  }
  await clearSignInFailures(email)
  await startSession(event, user)
  return { user: { id: user.id, email: user.email, name: user.name } }
})

let dummy: Promise<string> | undefined
function dummyHash() {
  dummy ??= hashPassword('not a password of anyone')
  return dummy
}
