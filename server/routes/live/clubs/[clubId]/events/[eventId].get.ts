// Every ring of an event, for the club's desks and the cue desk.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, eventParams)
  await requireClubRole(event, ids.clubId, [])
  const row = await findEvent(useDb(), ids.clubId, ids.eventId)
  const scope = { kind: 'event' as const, rings: allRings(row.rings) }
  await useLiveHub().stream(event.node.res, row.id, scope, parseLastEventId(lastEventId(event), scope))
})
