import { and, eq } from 'drizzle-orm'

/** A clip's progress, and once it is cut, short-lived addresses of the video and its poster. */
export default defineEventHandler(async (event) => {
  const { clubId, clipId } = validParams(event, clipParams)
  await requireClubRole(event, clubId, FOOTAGE_ROLES)
  const c = schema.clips
  const [clip] = await useDb().select().from(c).where(and(eq(c.id, clipId), eq(c.clubId, clubId)))
  if (!clip) throw notFoundError('Clip')
  return { clip: await clipView(clip) }
})
