/** The finals' bracket as the engine keeps it, its matches and the places decided so far; null before the finals. */
export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, [])
  const db = useDb()
  const { tournament } = await findTournament(db, ids)
  return bracketView(db, tournament)
})
