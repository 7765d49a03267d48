// The ring desk's one write: entries appended to a match's log, all or none, in one transaction
// with the match row locked. A resent entry (same id) is stored once and answered as a duplicate.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, matchParams)
  const { user } = await requireClubRole(event, ids.clubId, ['organizer', 'scorekeeper'])
  const body = await validBody(event, appendBodySchema)
  const entries = parseEntries(body.entries)
  const result = await useDb().transaction(async (tx) => {
    const { tournament } = await shareTournament(tx, ids)
    const match = await findMatch(tx, tournament.id, ids.matchId, { lock: true })
    requireMatchPhase(tournament, match, 'recording entries')
    requireBothSides(match)
    return appendEntries(tx, tournament, match, { expectedVersion: body.expectedVersion, entries }, user.id)
  })
  setResponseStatus(event, result.stored.length > 0 ? 201 : 200)
  return result
})
