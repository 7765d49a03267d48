export default defineEventHandler(async (event) => {
  const { clubId, eventId } = validParams(event, eventParams)
  await requireClubRole(event, clubId, [])
  const db = useDb()
  await findEvent(db, clubId, eventId)
  return { tournaments: await tournamentsOf(db, [eventId]) }
})
