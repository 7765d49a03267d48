import { tournamentSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const { clubId, eventId } = validParams(event, eventParams)
  await requireClubRole(event, clubId, ['organizer'])
  const input = await validBody(event, tournamentSchema)
  const db = useDb()
  await findEvent(db, clubId, eventId)
  const { ruleSet, version, settings } = await chooseRuleSet(db, clubId, input.ruleSetId, input.ruleSetVersion)
  const qualifyCount = input.qualifyCount ?? defaultQualifyCount(settings)
  requireRoundRobinSize(input.finalsFormat, qualifyCount)
  const [row] = await db.insert(schema.tournaments).values({
    eventId,
    name: input.name,
    weapon: input.weapon,
    ruleSetId: ruleSet.id,
    ruleSetVersion: version,
    poolSize: input.poolSize,
    qualifyCount,
    finalsFormat: input.finalsFormat,
    bronzeMatch: input.bronzeMatch,
  }).returning().catch((err: unknown) => {
    if (isUniqueViolation(err)) throw tournamentNameTaken()
    // The rule set was deleted between the check and the insert.
    if (isForeignKeyViolation(err)) throw fieldError(400, 'ruleSetId', 'No rule set with this id in this club')
    throw err
  })
  setResponseStatus(event, 201)
  return tournamentView(row!, ruleSet.name, undefined)
})
