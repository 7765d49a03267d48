// The ring desk's one write: entries appended to a match's log, all or none, acknowledged after
// the commit. A resent entry (same id) is stored once and answered as a duplicate.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, matchParams)
  const { user } = await requireClubRole(event, ids.clubId, ['organizer', 'scorekeeper'])
  const body = await validBody(event, appendBodySchema)
  const result = await appendEntries(ids, { expectedVersion: body.expectedVersion, entries: parseEntries(body.entries) }, user.id)
  setResponseStatus(event, result.stored.length > 0 ? 201 : 200)
  return result
})
