import { and, eq } from 'drizzle-orm'
import { ruleSetPatchSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const { clubId, ruleSetId } = validParams(event, ruleSetParams)
  const { user } = await requireClubRole(event, clubId, ['organizer'])
  const input = await validBody(event, ruleSetPatchSchema)
  const settings = input.settings === undefined ? undefined : validSettings(input.settings)
  const r = schema.ruleSets
  return useDb().transaction(async (tx) => {
    // Locked, so two edits at once make versions n+1 and n+2 rather than a clash.
    const [ruleSet] = await tx.select().from(r).where(and(eq(r.id, ruleSetId), eq(r.clubId, clubId))).for('update')
    if (!ruleSet) throw notFoundError('Rule set')
    const change: Partial<typeof r.$inferInsert> = { updatedAt: new Date() }
    if (input.name !== undefined) change.name = input.name
    if (settings !== undefined) {
      // Older versions stay as they were: tournaments that chose them keep them.
      const version = ruleSet.currentVersion + 1
      await tx.insert(schema.ruleSetVersions)
        .values({ ruleSetId, version, settings: stamped(settings, { name: input.name ?? ruleSet.name, version }), createdBy: user.id })
      change.currentVersion = version
    }
    await tx.update(r).set(change).where(eq(r.id, ruleSetId))
    return ruleSetDetail(tx, clubId, ruleSetId)
  }).catch((err: unknown) => {
    if (isUniqueViolation(err)) throw ruleSetNameTaken()
    throw err
  })
})
