export default defineEventHandler(async (event) => {
  const { clubId, eventId } = validParams(event, eventParams)
  await requireClubRole(event, clubId, [])
  const db = useDb()
  const row = await findEvent(db, clubId, eventId)
  return { ...eventView(row), tournaments: await tournamentsOf(db, [row.id]) }
})
