import { eq } from 'drizzle-orm'
import { postPreviewSchema } from '#shared/schemas/posts'

/** The editor's live preview: the body rendered exactly as the club site will show it now. */
export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, POST_ROLES)
  const { body } = await validBody(event, postPreviewSchema)
  const [club] = await useDb().select().from(schema.clubs).where(eq(schema.clubs.id, clubId))
  if (!club) throw notFoundError('Club')
  return { html: await renderPostBody(club, body) }
})
