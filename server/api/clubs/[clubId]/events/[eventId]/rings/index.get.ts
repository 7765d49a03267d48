// The event's rings with what their desks called and the board on air. Those who run the stream
// (streamer, organizer, admin) also get each ring's overlay address.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, eventParams)
  const { membership } = await requireClubRole(event, ids.clubId, [])
  const db = useDb()
  const row = await findEvent(db, ids.clubId, ids.eventId)
  const seesTokens = hasAnyRole(membership.roles, ['streamer', 'organizer', 'admin'])
  const rings = []
  for (const ring of allRings(row.rings)) {
    const state = await ringState(db, row.id, ring)
    rings.push({
      ring,
      currentMatchId: state.currentMatchId,
      version: state.version,
      board: { onAir: state.board, mode: state.boardMode },
      overlay: seesTokens ? { path: overlayPath(state.overlayToken), rotatedAt: state.tokenRotatedAt } : null,
    })
  }
  return { event: { id: row.id, name: row.name, rings: row.rings }, rings, at: new Date().toISOString() }
})
