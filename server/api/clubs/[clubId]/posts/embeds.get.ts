import { and, asc, desc, eq, isNotNull, ne } from 'drizzle-orm'
import { alias } from 'drizzle-orm/pg-core'

/** What the editor's embed buttons offer: the club's clips, pools, matches and events. */
export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, POST_ROLES)
  const db = useDb()
  const e = schema.events
  const t = schema.tournaments
  const c = schema.clips
  const m = schema.matches
  const events = await db.select({ id: e.id, slug: e.slug, name: e.name, published: e.published, startsOn: e.startsOn })
    .from(e).where(eq(e.clubId, clubId)).orderBy(desc(e.startsOn), desc(e.id))
  const clips = await db.select({ id: c.id, title: c.title, status: c.status, eventName: e.name, published: e.published })
    .from(c).innerJoin(schema.recordings, eq(schema.recordings.id, c.recordingId)).innerJoin(e, eq(e.id, schema.recordings.eventId))
    .where(eq(c.clubId, clubId)).orderBy(desc(c.id)).limit(500)
  const pools = await db.select({ tournamentId: t.id, tournamentName: t.name, number: schema.pools.number, eventName: e.name, published: e.published })
    .from(schema.pools).innerJoin(t, eq(t.id, schema.pools.tournamentId)).innerJoin(e, eq(e.id, t.eventId))
    .where(eq(e.clubId, clubId)).orderBy(desc(e.startsOn), asc(t.id), asc(schema.pools.number)).limit(500)
  const entryA = alias(schema.entries, 'entry_a')
  const entryB = alias(schema.entries, 'entry_b')
  const fighterA = alias(schema.fighters, 'fighter_a')
  const fighterB = alias(schema.fighters, 'fighter_b')
  const matches = await db.select({
    id: m.id, stage: m.stage, status: m.status, tournamentName: t.name, eventName: e.name, published: e.published, a: fighterA.name, b: fighterB.name,
  }).from(m).innerJoin(t, eq(t.id, m.tournamentId)).innerJoin(e, eq(e.id, t.eventId))
    .innerJoin(entryA, eq(entryA.id, m.sideAEntry)).innerJoin(fighterA, eq(fighterA.id, entryA.fighterId))
    .innerJoin(entryB, eq(entryB.id, m.sideBEntry)).innerJoin(fighterB, eq(fighterB.id, entryB.fighterId))
    .where(and(eq(e.clubId, clubId), isNotNull(m.sideAEntry), ne(m.status, 'scheduled')))
    .orderBy(desc(e.startsOn), asc(t.id), asc(m.id)).limit(1000)
  return { events, clips, pools, matches }
})
