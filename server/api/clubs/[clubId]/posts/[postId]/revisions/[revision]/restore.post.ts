import { and, eq } from 'drizzle-orm'
import { postRestoreSchema } from '#shared/schemas/posts'

// Restoring keeps the history whole: the old text comes back as a new revision.
export default defineEventHandler(async (event) => {
  const { clubId, postId, revision } = validParams(event, revisionParams)
  const { user, membership } = await requireClubRole(event, clubId, POST_ROLES)
  const { expectedVersion } = await validBody(event, postRestoreSchema)
  return useDb().transaction(async (tx) => {
    const post = await findPost(tx, clubId, postId, { lock: true })
    requireEdit(membership.roles, user.id, post)
    await requireVersion(tx, post, expectedVersion)
    const r = schema.postRevisions
    const [old] = await tx.select().from(r).where(and(eq(r.postId, postId), eq(r.number, revision)))
    if (!old) throw notFoundError('Revision')
    const [saved] = await tx.update(schema.posts)
      .set({ title: old.title, summary: old.summary, body: old.body, version: post.version + 1, updatedAt: new Date() })
      .where(eq(schema.posts.id, postId)).returning()
    await writeRevision(tx, saved!, user.id)
    return postView(tx, saved!)
  })
})
