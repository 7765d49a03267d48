import { eq } from 'drizzle-orm'
import { postStatusSchema } from '#shared/schemas/posts'

// The workflow: a writer submits a draft for review; an editor or admin publishes it (now or at a
// set time) or sends it back to draft. E-mail to subscribers is not sent here: a worker picks up
// published posts whose time has come and which have no `announcedAt` yet.
export default defineEventHandler(async (event) => {
  const { clubId, postId } = validParams(event, postParams)
  const { user, membership } = await requireClubRole(event, clubId, POST_ROLES)
  const { expectedVersion, to, publishAt } = await validBody(event, postStatusSchema)
  const publisher = isPublisher(membership.roles)
  if (publishAt !== null && to !== 'published') throw fieldError(400, 'publishAt', 'A time is only for publishing')
  // A minute of leeway for clocks and slow forms; further back is a mistake, not a schedule.
  if (publishAt !== null && new Date(publishAt).getTime() < Date.now() - 60_000) throw fieldError(400, 'publishAt', 'Choose a time in the future, or publish now')
  const db = useDb()
  return db.transaction(async (tx) => {
    const post = await findPost(tx, clubId, postId, { lock: true })
    await requireVersion(tx, post, expectedVersion)
    const change: Partial<typeof schema.posts.$inferInsert> = { status: to, version: post.version + 1, updatedAt: new Date() }
    if (to === 'review') {
      if (post.status !== 'draft') throw fieldError(409, 'to', 'Only a draft can be submitted for review')
      if (!publisher && post.authorId !== user.id) throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'Only its writer, an editor or an admin can submit this breakdown' })
    }
    else if (to === 'published') {
      if (!publisher) throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'This needs the Editor or Admin role' })
      const at = publishAt === null ? new Date() : new Date(publishAt)
      // Already out: its first publication time stays (readers and feeds have seen it).
      const live = post.status === 'published' && post.publishedAt !== null && post.publishedAt.getTime() <= Date.now()
      if (live && publishAt !== null) throw fieldError(409, 'publishAt', 'This breakdown is already out; send it back to draft first to schedule it')
      change.publishAt = publishAt === null ? null : at
      change.publishedAt = live ? post.publishedAt : at
      change.publishedBy = user.id
    }
    else {
      if (!publisher) throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'This needs the Editor or Admin role' })
      if (post.status === 'draft') throw fieldError(409, 'to', 'This breakdown is a draft already')
      change.publishAt = null
      change.publishedAt = null
    }
    const [saved] = await tx.update(schema.posts).set(change).where(eq(schema.posts.id, postId)).returning()
    return postView(tx, saved!)
  })
})
