import { and, eq, inArray } from 'drizzle-orm'
import { z } from 'zod'

const callSchema = z.object({
  // null sends the ring back to "nothing called".
  matchId: z.number({ error: 'matchId: choose a match, or null' }).int({ error: 'matchId: choose a match' }).positive({ error: 'matchId: choose a match' }).max(2147483647).nullable(),
  expectedVersion: z.number({ error: 'expectedVersion: send the ring\'s version you last saw' }).int().min(0),
}).strict()

// The desk calls a match to its ring: the boards show it and its fighters are told to come. A desk
// calling from a stale view gets 409 with the ring as it is now.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, ringParams)
  await requireClubRole(event, ids.clubId, ['organizer', 'scorekeeper'])
  const { matchId, expectedVersion } = await validBody(event, callSchema)
  return useDb().transaction(async (tx) => {
    const row = await findRing(tx, ids)
    const state = await ringState(tx, row.id, ids.ring, { lock: true })
    if (state.version !== expectedVersion) {
      throw createError({
        statusCode: 409,
        statusMessage: 'Conflict',
        message: `expectedVersion: another desk changed ring ${ids.ring} (version ${state.version}, not ${expectedVersion}); look at the match it called`,
        data: { fields: { expectedVersion: `The ring is at version ${state.version}` }, ring: await ringSnapshot(tx, row.id, ids.ring) },
      })
    }
    if (matchId !== null) {
      const m = schema.matches
      const t = schema.tournaments
      const [found] = await tx.select({ match: m, tournament: t }).from(m).innerJoin(t, eq(t.id, m.tournamentId))
        .where(and(eq(m.id, matchId), eq(t.eventId, row.id), inArray(t.phase, ['pools', 'finals'])))
      if (!found) throw fieldError(400, 'matchId', 'No match of this event is being fenced with this id')
      const { match, tournament } = found
      if (match.sideAEntry === null || match.sideBEntry === null) throw fieldError(409, 'matchId', 'This final match is waiting for the winner of an earlier match')
      if (match.status === 'finished' || match.status === 'forfeit') throw fieldError(409, 'matchId', 'This match is over')
      if (match.stage === 'pool' ? tournament.phase !== 'pools' : tournament.phase !== 'finals') throw fieldError(409, 'matchId', 'This match is not being fenced in the current phase')
      const place = await matchPlace(tx, tournament, match, row.rings)
      if (place.ring !== ids.ring) throw fieldError(409, 'matchId', `This match is fenced in ring ${place.ring}`)
    }
    const r = schema.ringStates
    await tx.update(r).set({ currentMatchId: matchId, version: state.version + 1, updatedAt: new Date() })
      .where(and(eq(r.eventId, row.id), eq(r.ringNumber, ids.ring)))
    await markRingsDirty(tx, row.id, [ids.ring])
    return ringSnapshot(tx, row.id, ids.ring)
  })
})
