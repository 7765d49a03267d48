/**
 * The finals: format, finalists, the bracket or the round robin's table, the matches and the
 * places so far; empty before the finals. In a transaction, as a finished round robin may record its lot.
 */
export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, [])
  return useDb().transaction(async (tx) => {
    const { tournament } = await findTournament(tx, ids)
    return finalsView(tx, tournament)
  })
})
