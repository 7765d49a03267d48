import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  await useDb().transaction(async (tx) => {
    const { tournament } = await findTournament(tx, ids, { lock: true })
    requirePhase(tournament, ['entries'], 'deleting it')
    await tx.delete(schema.tournaments).where(eq(schema.tournaments.id, ids.tournamentId))
  })
  setResponseStatus(event, 204)
  return null
})
