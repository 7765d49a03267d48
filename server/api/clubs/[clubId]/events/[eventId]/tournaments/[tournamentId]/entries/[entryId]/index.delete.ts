import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const ids = validParams(event, entryParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  await useDb().transaction(async (tx) => {
    const { tournament, entry } = await lockEntry(tx, ids)
    requirePhase(tournament, ['entries'], 'removing entries (withdraw the fighter instead)')
    await tx.delete(schema.entries).where(eq(schema.entries.id, entry.id))
  })
  setResponseStatus(event, 204)
  return null
})
