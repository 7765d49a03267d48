/** The club's recordings (optionally of one event), by event and ring. */
export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, FOOTAGE_ROLES)
  const { eventId } = validQuery(event, recordingListQuery)
  return { recordings: await listRecordings(useDb(), clubId, eventId) }
})
