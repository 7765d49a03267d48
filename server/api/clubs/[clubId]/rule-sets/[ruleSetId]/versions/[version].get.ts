import { and, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, ruleSetId, version } = validParams(event, ruleSetVersionParams)
  await requireClubRole(event, clubId, [])
  const v = schema.ruleSetVersions
  const [row] = await useDb().select({ version: v }).from(v)
    .innerJoin(schema.ruleSets, eq(schema.ruleSets.id, v.ruleSetId))
    .where(and(eq(v.ruleSetId, ruleSetId), eq(v.version, version), eq(schema.ruleSets.clubId, clubId)))
  if (!row) throw notFoundError('Rule-set version')
  return { ...versionView(row.version), settings: row.version.settings }
})
