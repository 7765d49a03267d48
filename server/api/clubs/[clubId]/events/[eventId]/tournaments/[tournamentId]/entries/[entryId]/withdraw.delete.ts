import { eq } from 'drizzle-orm'

// Takes a withdrawal back, e.g. one recorded for the wrong fighter. Before the finals nothing was
// forfeited by it (the pool tables read the status), so the fighter simply returns as they were.
// In the finals their matches were forfeited and those results stand.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, entryParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  return useDb().transaction(async (tx) => {
    const { tournament, entry, fighter } = await lockEntry(tx, ids)
    requirePhase(tournament, ['entries', 'pools'], 'taking a withdrawal back')
    if (entry.status !== 'withdrawn') throw conflictError(`${fighter.name} has not withdrawn`)
    const checkedIn = entry.checkedInAt !== null && entry.kitChecked && entry.weaponChecked
    if (tournament.phase === 'pools') {
      const loaded = await loadPools(tx, tournament.id)
      if (loaded.length > 0 && !loaded.some(p => p.entryIds.includes(entry.id))) {
        throw conflictError(`${fighter.name} withdrew before the pools were drawn and is in no pool; the pools would have to be drawn again`)
      }
    }
    const [row] = await tx.update(schema.entries).set({ status: checkedIn ? 'checked-in' : 'entered', withdrawnAt: null, withdrawalReason: null })
      .where(eq(schema.entries.id, entry.id)).returning()
    if (tournament.phase !== 'entries') await markRingsDirty(tx, tournament.eventId)
    return entryView(row!, fighter)
  })
})
