import { and, count, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, ruleSetId } = validParams(event, ruleSetParams)
  await requireClubRole(event, clubId, ['organizer'])
  const r = schema.ruleSets
  const inUse = () => conflictError('A tournament uses this rule set, so it cannot be deleted. Edit it instead: tournaments keep the version they chose.')
  await useDb().transaction(async (tx) => {
    const [ruleSet] = await tx.select().from(r).where(and(eq(r.id, ruleSetId), eq(r.clubId, clubId))).for('update')
    if (!ruleSet) throw notFoundError('Rule set')
    const [used] = await tx.select({ n: count() }).from(schema.tournaments).where(eq(schema.tournaments.ruleSetId, ruleSetId))
    if ((used?.n ?? 0) > 0) throw inUse()
    await tx.delete(r).where(eq(r.id, ruleSetId))
  }).catch((err: unknown) => {
    // A tournament created at the same moment: the foreign key decides.
    if (isForeignKeyViolation(err)) throw inUse()
    throw err
  })
  setResponseStatus(event, 204)
  return null
})
