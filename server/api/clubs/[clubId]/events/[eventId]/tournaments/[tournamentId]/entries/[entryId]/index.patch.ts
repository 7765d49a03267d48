import { eq } from 'drizzle-orm'
import { entryPatchSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const ids = validParams(event, entryParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  const { seed } = await validBody(event, entryPatchSchema)
  return useDb().transaction(async (tx) => {
    const { tournament, entry, fighter } = await lockEntry(tx, ids)
    requirePhase(tournament, ['entries'], 'changing seeds')
    await assertSeedFree(tx, tournament.id, seed, entry.id)
    const [row] = await tx.update(schema.entries).set({ seed }).where(eq(schema.entries.id, entry.id)).returning()
    return entryView(row!, fighter)
  })
})
