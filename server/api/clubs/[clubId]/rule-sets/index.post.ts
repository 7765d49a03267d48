import { ruleSetCreateSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  const { user } = await requireClubRole(event, clubId, ['organizer'])
  const input = await validBody(event, ruleSetCreateSchema)
  let start: unknown = input.settings
  if (input.preset !== undefined) {
    start = presetSettings(input.preset)
    if (!start) throw fieldError(400, 'preset', `Unknown preset; choose one of: ${presetNames().join(', ')}`)
  }
  const settings = stamped(validSettings(start), { name: input.name, version: 1 })
  const db = useDb()
  const ruleSetId = await db.transaction(async (tx) => {
    const [ruleSet] = await tx.insert(schema.ruleSets).values({ clubId, name: input.name, currentVersion: 1 }).returning()
    await tx.insert(schema.ruleSetVersions).values({ ruleSetId: ruleSet!.id, version: 1, settings, createdBy: user.id })
    return ruleSet!.id
  }).catch((err: unknown) => {
    if (isUniqueViolation(err)) throw ruleSetNameTaken()
    throw err
  })
  setResponseStatus(event, 201)
  return ruleSetDetail(db, clubId, ruleSetId)
})
