import { count, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, [])
  const r = schema.ruleSets
  const t = schema.tournaments
  const rows = await useDb().select({ ruleSet: r, usedBy: count(t.id) }).from(r)
    .leftJoin(t, eq(t.ruleSetId, r.id))
    .where(eq(r.clubId, clubId)).groupBy(r.id).orderBy(r.name)
  return { ruleSets: rows.map(row => ruleSetView(row.ruleSet, { usedBy: row.usedBy })) }
})
