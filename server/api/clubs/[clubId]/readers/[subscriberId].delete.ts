import { and, eq } from 'drizzle-orm'
import { idParamSchema } from '#shared/schemas/club'

const params = clubParams.extend({ subscriberId: idParamSchema })

/** Removes a reader (e.g. at their request by other means): no more mail to them. */
export default defineEventHandler(async (event) => {
  const { clubId, subscriberId } = validParams(event, params)
  await requireClubRole(event, clubId, ['editor', 'admin'])
  const s = schema.subscribers
  const [row] = await useDb().delete(s).where(and(eq(s.id, subscriberId), eq(s.clubId, clubId))).returning({ id: s.id })
  if (!row) throw notFoundError('Reader')
  setResponseStatus(event, 204)
  return null
})
