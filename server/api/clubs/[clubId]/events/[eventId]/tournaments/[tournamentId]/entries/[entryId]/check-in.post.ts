import { eq } from 'drizzle-orm'
import { checkInSchema } from '#shared/schemas/tournament'

// Check-in is where the kit and the blade are inspected; the body must confirm both checks.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, entryParams)
  const { user } = await requireClubRole(event, ids.clubId, ['organizer'])
  await validBody(event, checkInSchema)
  return useDb().transaction(async (tx) => {
    const { tournament, entry, fighter } = await lockEntry(tx, ids)
    requirePhase(tournament, ['entries'], 'checking in')
    if (entry.status === 'withdrawn') throw conflictError(`${fighter.name} has withdrawn and cannot be checked in`)
    // A repeated check-in (a retry on bad Wi-Fi) keeps the first time.
    if (entry.status === 'checked-in') return entryView(entry, fighter)
    const [row] = await tx.update(schema.entries).set({
      status: 'checked-in', kitChecked: true, weaponChecked: true, checkedInAt: new Date(), checkedInBy: user.id,
    }).where(eq(schema.entries.id, entry.id)).returning()
    return entryView(row!, fighter)
  })
})
