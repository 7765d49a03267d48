export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, [])
  const db = useDb()
  const { tournament } = await findTournament(db, ids)
  return { pools: await poolViews(db, tournament) }
})
