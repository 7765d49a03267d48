import { desc, eq, sql } from 'drizzle-orm'

/** The club's readers: counts by status, the list (newest first) and the mailings with their progress. */
export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, ['editor', 'admin'])
  const s = schema.subscribers
  const db = useDb()
  const rows = await db.select().from(s).where(eq(s.clubId, clubId)).orderBy(desc(s.createdAt), desc(s.id))
  const counts = { pending: 0, confirmed: 0, unsubscribed: 0 }
  for (const row of rows) counts[row.status] += 1
  const [pending] = await db.select({ n: sql<number>`count(*)::int` }).from(schema.posts)
    .where(sql`${schema.posts.clubId} = ${clubId} and ${schema.posts.status} = 'published' and ${schema.posts.announcedAt} is null`)
  return {
    counts,
    readers: rows.map(row => ({
      id: row.id,
      email: row.email,
      status: row.status,
      createdAt: row.createdAt,
      confirmedAt: row.confirmedAt,
      unsubscribedAt: row.unsubscribedAt,
    })),
    mailings: await clubMailings(clubId),
    postsWaiting: pending?.n ?? 0,
  }
})
