import { and, eq } from 'drizzle-orm'
import { entryCreateSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  const { fighterId, seed } = await validBody(event, entryCreateSchema)
  const view = await useDb().transaction(async (tx) => {
    const { tournament } = await findTournament(tx, ids, { lock: true })
    requirePhase(tournament, ['entries'], 'adding entries')
    const f = schema.fighters
    const [fighter] = await tx.select().from(f).where(and(eq(f.id, fighterId), eq(f.clubId, ids.clubId)))
    if (!fighter) throw fieldError(400, 'fighterId', 'No fighter with this id in the club\'s roster')
    await assertSeedFree(tx, tournament.id, seed)
    const [entry] = await tx.insert(schema.entries).values({ tournamentId: tournament.id, fighterId, seed }).returning()
      .catch((err: unknown) => {
        if (isUniqueViolation(err)) throw fieldError(409, 'fighterId', `${fighter.name} is already entered in this tournament`)
        throw err
      })
    return entryView(entry!, fighter)
  })
  setResponseStatus(event, 201)
  return view
})
