import { eq } from 'drizzle-orm'
import { postPatchSchema } from '#shared/schemas/posts'

export default defineEventHandler(async (event) => {
  const { clubId, postId } = validParams(event, postParams)
  const { user, membership } = await requireClubRole(event, clubId, POST_ROLES)
  const { expectedVersion, ...change } = await validBody(event, postPatchSchema)
  const db = useDb()
  return db.transaction(async (tx) => {
    const post = await findPost(tx, clubId, postId, { lock: true })
    requireEdit(membership.roles, user.id, post)
    await requireVersion(tx, post, expectedVersion)
    await requireClubEvent(tx, clubId, change.eventId)
    const [saved] = await tx.update(schema.posts)
      .set({ ...change, version: post.version + 1, updatedAt: new Date() })
      .where(eq(schema.posts.id, postId)).returning()
    await writeRevision(tx, saved!, user.id)
    return postView(tx, saved!)
  })
})
