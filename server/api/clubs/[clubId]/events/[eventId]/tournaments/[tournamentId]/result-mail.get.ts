/** The result-card mailing of a tournament (null before the first), and how many fighters can get one. */
export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  return resultMailState(ids)
})
