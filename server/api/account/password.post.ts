import { eq } from 'drizzle-orm'
import { passwordChangeSchema } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { currentPassword, newPassword } = await validBody(event, passwordChangeSchema)
  const db = useDb()
  const [row] = await db.select({ passwordHash: schema.users.passwordHash }).from(schema.users).where(eq(schema.users.id, user.id))
  if (!row || !await verifyPassword(row.passwordHash, currentPassword)) {
    throw fieldError(400, 'currentPassword', 'This is not your current password')
  }
  await db.update(schema.users).set({ passwordHash: await hashPassword(newPassword) }).where(eq(schema.users.id, user.id))
  setResponseStatus(event, 204)
  return null
})
