import { eq } from 'drizzle-orm'
import { postCreateSchema } from '#shared/schemas/posts'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  const { user } = await requireClubRole(event, clubId, POST_ROLES)
  const input = await validBody(event, postCreateSchema)
  const db = useDb()
  const post = await db.transaction(async (tx) => {
    await requireClubEvent(tx, clubId, input.eventId)
    // One new post at a time per club, so that two posts with one title get different slugs.
    await tx.select({ id: schema.clubs.id }).from(schema.clubs).where(eq(schema.clubs.id, clubId)).for('update')
    const slug = await freeSlug(tx, clubId, input.title)
    const [created] = await tx.insert(schema.posts).values({ clubId, slug, ...input, authorId: user.id }).returning()
    await writeRevision(tx, created!, user.id)
    return created!
  })
  setResponseStatus(event, 201)
  return postView(db, post)
})
