export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, [])
  return tournamentDetail(useDb(), ids)
})
