import { and, eq, inArray } from 'drizzle-orm'
import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'

const params = z.object({ slug: slugSchema })

const SITEMAP_MAX = 50_000

// The sitemaps.org protocol 0.9: a urlset of url/loc (absolute, XML-escaped), lastmod optional.
export default defineEventHandler(async (event) => {
  const { slug } = validParams(event, params)
  const db = useDb()
  const club = await findPublicClub(db, slug)
  const e = schema.events
  const events = await db.select({ id: e.id, slug: e.slug, updatedAt: e.updatedAt }).from(e).where(and(eq(e.clubId, club.id), eq(e.published, true)))
  const posts = await livePosts(db, club.id, SITEMAP_MAX)
  const fighters = events.length === 0
    ? []
    : await db.selectDistinct({ id: schema.entries.fighterId }).from(schema.entries)
        .innerJoin(schema.tournaments, eq(schema.tournaments.id, schema.entries.tournamentId))
        .where(inArray(schema.tournaments.eventId, events.map(x => x.id)))
  const site = `/site/${club.slug}`
  const urls: { loc: string, lastmod?: Date }[] = [
    { loc: site },
    ...posts.map(p => ({ loc: postPath(club.slug, p.slug), lastmod: p.updatedAt })),
    ...events.map(x => ({ loc: `${site}/events/${x.slug}`, lastmod: x.updatedAt })),
    ...fighters.map(f => ({ loc: `${site}/fighters/${f.id}` })),
  ].slice(0, SITEMAP_MAX)
  setResponseHeader(event, 'content-type', 'application/xml; charset=utf-8')
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<urlset xmlns="http://www.sitemaps.org/schemas/sitemap/0.9">',
    ...urls.map(u => `<url><loc>${escapeMarkup(appLink(u.loc))}</loc>${u.lastmod ? `<lastmod>${u.lastmod.toISOString()}</lastmod>` : ''}</url>`),
    '</urlset>',
  ].join('\n')
})
