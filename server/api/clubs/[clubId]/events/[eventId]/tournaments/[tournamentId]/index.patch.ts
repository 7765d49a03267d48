import { eq } from 'drizzle-orm'
import { tournamentPatchSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  const input = await validBody(event, tournamentPatchSchema)
  const db = useDb()
  await db.transaction(async (tx) => {
    const { tournament } = await findTournament(tx, ids, { lock: true })
    const change: Partial<typeof schema.tournaments.$inferInsert> = {}
    if (input.name !== undefined) change.name = input.name
    if (input.weapon !== undefined) change.weapon = input.weapon
    // Rules and pool size shape the pools, so they are settled once the pools start.
    if (input.ruleSetId !== undefined || input.ruleSetVersion !== undefined || input.poolSize !== undefined) {
      requirePhase(tournament, ['entries'], 'changing the rule set or the pool size')
    }
    if (input.ruleSetId !== undefined || input.ruleSetVersion !== undefined) {
      const sameSet = input.ruleSetId === undefined || input.ruleSetId === tournament.ruleSetId
      const { ruleSet, version } = await chooseRuleSet(tx, ids.clubId, input.ruleSetId ?? tournament.ruleSetId,
        input.ruleSetVersion ?? (sameSet ? tournament.ruleSetVersion : undefined))
      change.ruleSetId = ruleSet.id
      change.ruleSetVersion = version
    }
    if (input.poolSize !== undefined) change.poolSize = input.poolSize
    if (input.qualifyCount !== undefined) {
      requirePhase(tournament, ['entries', 'pools'], 'changing how many reach the finals')
      change.qualifyCount = input.qualifyCount
    }
    if (input.finalsFormat !== undefined || input.bronzeMatch !== undefined) {
      requirePhase(tournament, ['entries', 'pools'], 'changing the format of the finals')
      if (input.finalsFormat !== undefined) change.finalsFormat = input.finalsFormat
      if (input.bronzeMatch !== undefined) change.bronzeMatch = input.bronzeMatch
    }
    requireRoundRobinSize(change.finalsFormat ?? tournament.finalsFormat, change.qualifyCount ?? tournament.qualifyCount)
    if (Object.keys(change).length > 0) {
      await tx.update(schema.tournaments).set(change).where(eq(schema.tournaments.id, ids.tournamentId))
    }
  }).catch((err: unknown) => {
    if (isUniqueViolation(err)) throw tournamentNameTaken()
    if (isForeignKeyViolation(err)) throw fieldError(400, 'ruleSetId', 'No rule set with this id in this club')
    throw err
  })
  return tournamentDetail(db, ids)
})
