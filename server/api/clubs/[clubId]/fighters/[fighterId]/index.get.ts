import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, fighterId } = validParams(event, fighterParams)
  await requireClubRole(event, clubId, [])
  const db = useDb()
  const fighter = await findFighter(db, clubId, fighterId)
  const n = schema.entries
  const t = schema.tournaments
  const e = schema.events
  const entries = await db.select({
    entryId: n.id, status: n.status, seed: n.seed,
    tournamentId: t.id, tournamentName: t.name, weapon: t.weapon, phase: t.phase,
    eventId: e.id, eventName: e.name, startsOn: e.startsOn,
  }).from(n).innerJoin(t, eq(t.id, n.tournamentId)).innerJoin(e, eq(e.id, t.eventId))
    .where(eq(n.fighterId, fighterId)).orderBy(e.startsOn, t.name)
  return { ...fighterView(fighter), entries }
})
