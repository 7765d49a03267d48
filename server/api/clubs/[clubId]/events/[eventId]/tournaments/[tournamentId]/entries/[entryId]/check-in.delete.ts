import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const ids = validParams(event, entryParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  return useDb().transaction(async (tx) => {
    const { tournament, entry, fighter } = await lockEntry(tx, ids)
    requirePhase(tournament, ['entries'], 'undoing a check-in (withdraw the fighter instead)')
    if (entry.status === 'withdrawn') throw conflictError(`${fighter.name} has withdrawn; there is no check-in to undo`)
    if (entry.status === 'entered') return entryView(entry, fighter)
    // The checklist goes with the check-in: a new check-in must confirm both checks again.
    const [row] = await tx.update(schema.entries).set({
      status: 'entered', kitChecked: false, weaponChecked: false, checkedInAt: null, checkedInBy: null,
    }).where(eq(schema.entries.id, entry.id)).returning()
    return entryView(row!, fighter)
  })
})
