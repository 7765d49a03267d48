import { and, desc, eq, ne } from 'drizzle-orm'
import { brandNotice, cardPalette } from '#shared/cards/palette'

/** The studio's start: the club's brand as cards use it, and every tournament that has cards to make. */
export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, ['editor'])
  const db = useDb()
  const [club] = await db.select().from(schema.clubs).where(eq(schema.clubs.id, clubId))
  if (!club) throw notFoundError('Club')
  const t = schema.tournaments
  const e = schema.events
  const rows = await db.select({ tournament: t, event: e }).from(t).innerJoin(e, eq(e.id, t.eventId))
    .where(and(eq(e.clubId, clubId), ne(t.phase, 'entries'))).orderBy(desc(e.startsOn), e.name, t.id)
  const palette = cardPalette(club.primaryColor, club.secondaryColor)
  return {
    brand: {
      clubName: club.name,
      logoUrl: logoUrl(club),
      checks: palette.checks,
      notice: brandNotice(palette),
    },
    tournaments: rows.map(({ tournament, event: ev }) => ({
      id: tournament.id,
      name: tournament.name,
      weapon: tournament.weapon,
      phase: tournament.phase,
      event: { id: ev.id, name: ev.name, slug: ev.slug, published: ev.published, startsOn: ev.startsOn },
    })),
  }
})
