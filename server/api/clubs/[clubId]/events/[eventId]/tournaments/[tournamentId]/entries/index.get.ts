import { z } from 'zod'
import { ENTRY_STATUSES } from '#shared/schemas/tournament'

const query = z.object({
  status: z.enum(ENTRY_STATUSES, { error: `Use one of: ${ENTRY_STATUSES.join(', ')}` }).optional(),
}).strict()

export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, [])
  const { status } = validQuery(event, query)
  const db = useDb()
  const { tournament } = await findTournament(db, ids)
  return { tournament: { id: tournament.id, name: tournament.name, phase: tournament.phase }, entries: await listEntries(db, tournament.id, status) }
})
