import { and, desc, eq } from 'drizzle-orm'
import { postListQuerySchema } from '#shared/schemas/posts'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  const { membership } = await requireClubRole(event, clubId, POST_ROLES)
  const { status } = validQuery(event, postListQuerySchema)
  const p = schema.posts
  const db = useDb()
  const rows = await db.select({
    id: p.id, slug: p.slug, title: p.title, summary: p.summary, status: p.status, publishAt: p.publishAt, publishedAt: p.publishedAt,
    authorId: p.authorId, authorName: schema.users.name, version: p.version, updatedAt: p.updatedAt,
  }).from(p).leftJoin(schema.users, eq(schema.users.id, p.authorId))
    .where(and(eq(p.clubId, clubId), status ? eq(p.status, status) : undefined))
    .orderBy(desc(p.updatedAt), desc(p.id))
  return {
    canPublish: isPublisher(membership.roles),
    posts: rows.map(row => ({ ...row, stage: postStage(row) })),
  }
})
