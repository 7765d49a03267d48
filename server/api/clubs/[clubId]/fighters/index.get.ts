import { and, eq, ilike, or, sql } from 'drizzle-orm'
import { z } from 'zod'

const query = z.object({
  q: z.string({ error: 'Search with one piece of text' }).trim().max(100, { error: 'Use at most 100 characters' }).optional(),
}).strict()

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, [])
  const { q } = validQuery(event, query)
  const f = schema.fighters
  const pattern = q ? `%${q.replace(/[\\%_]/g, c => `\\${c}`)}%` : undefined
  const rows = await useDb().select().from(f)
    .where(and(eq(f.clubId, clubId), pattern ? or(ilike(f.name, pattern), ilike(f.clubName, pattern)) : undefined))
    .orderBy(sql`lower(${f.name})`, sql`lower(${f.clubName})`)
  return { fighters: rows.map(fighterView) }
})
