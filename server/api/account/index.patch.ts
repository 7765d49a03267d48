import { eq } from 'drizzle-orm'
import { accountUpdateSchema } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { name } = await validBody(event, accountUpdateSchema)
  const [updated] = await useDb().update(schema.users).set({ name }).where(eq(schema.users.id, user.id))
    .returning({ id: schema.users.id, email: schema.users.email, name: schema.users.name })
  if (!updated) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Account not found' })
  await startSession(event, updated)
  return { user: updated }
})
