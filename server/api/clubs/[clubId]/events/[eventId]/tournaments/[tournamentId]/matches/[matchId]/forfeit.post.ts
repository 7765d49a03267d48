import { z } from 'zod'
import { SIDES, deriveMatch, otherSide } from '#shared/rules'
import { tidySpaces } from '#shared/schemas/tournament'

const forfeitSchema = z.object({
  side: z.enum(SIDES, { error: 'Choose the side that forfeits: a or b' }),
  reason: z.string({ error: 'Give a reason, e.g. withdrawn after an injury' }).transform(tidySpaces)
    .pipe(z.string().min(1, { error: 'Give a reason, e.g. withdrawn after an injury' }).max(300, { error: 'Use at most 300 characters' })),
}).strict()

// The side named forfeits and the other wins, e.g. for a withdrawn or expelled fighter. The log
// keeps whatever was recorded. A final match that ended level (a draw or a double-out) is settled
// the same way, by the director's decision, so that the bracket can go on.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, matchParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  const { side, reason } = await validBody(event, forfeitSchema)
  return useDb().transaction(async (tx) => {
    const locked = await lockMatch(tx, ids)
    const { tournament, match } = locked
    requireMatchPhase(tournament, match, 'recording a forfeit')
    requireBothSides(match)
    if (match.status === 'forfeit') throw conflictError(`Side ${match.forfeitedBy} has already forfeited this match`)
    const log = (await matchLogs(tx, [match.id])).get(match.id)!
    const before = deriveMatch(rulesOf(tournament), payloads(log))
    const level = before.finished && (before.result === 'draw' || before.result === 'both-lose')
    if (match.status === 'finished' && !(match.stage === 'final' && level)) {
      throw conflictError('The match is finished and its result stands')
    }
    const updated = await forfeitMatch(tx, match, side, reason)
    if (match.stage === 'final') await advanceFinal(tx, tournament.id, updated, otherSide(side))
    await publishMatch(tx, locked, updated, payloads(log), before)
    return { match: matchSummary(updated, locked.sides, before), state: before }
  })
})
