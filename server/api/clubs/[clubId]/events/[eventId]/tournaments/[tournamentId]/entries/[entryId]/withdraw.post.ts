import { eq } from 'drizzle-orm'
import { withdrawSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const ids = validParams(event, entryParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  const { reason } = await validBody(event, withdrawSchema)
  return useDb().transaction(async (tx) => {
    const { tournament, entry, fighter } = await lockEntry(tx, ids)
    requirePhase(tournament, ['entries', 'pools', 'finals'], 'withdrawing')
    if (entry.status === 'withdrawn') throw conflictError(`${fighter.name} has already withdrawn`)
    const [row] = await tx.update(schema.entries).set({ status: 'withdrawn', withdrawnAt: new Date(), withdrawalReason: reason })
      .where(eq(schema.entries.id, entry.id)).returning()
    // In the pools the rule set says how the table treats a withdrawal; a bracket cannot wait.
    if (tournament.phase === 'finals') await forfeitWithdrawnFinals(tx, tournament.id, entry.id, reason)
    if (tournament.phase !== 'entries') await markRingsDirty(tx, tournament.eventId)
    return entryView(row!, fighter)
  })
})
