import { desc, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, postId } = validParams(event, postParams)
  await requireClubRole(event, clubId, POST_ROLES)
  const db = useDb()
  await findPost(db, clubId, postId)
  const r = schema.postRevisions
  const revisions = await db.select({
    number: r.number, title: r.title, summary: r.summary, body: r.body, createdAt: r.createdAt, authorName: schema.users.name,
  }).from(r).leftJoin(schema.users, eq(schema.users.id, r.authorId)).where(eq(r.postId, postId)).orderBy(desc(r.number))
  return { revisions }
})
