import { and, desc, eq } from 'drizzle-orm'
import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'

const params = z.object({ clubSlug: slugSchema })

/** A club's published events, newest first, for the club site. */
export default defineEventHandler(async (event) => {
  const { clubSlug } = validParams(event, params)
  const db = useDb()
  const [club] = await db.select().from(schema.clubs).where(eq(schema.clubs.slug, clubSlug))
  if (!club) throw notFoundError('Club')
  const rows = await db.select().from(schema.events)
    .where(and(eq(schema.events.clubId, club.id), eq(schema.events.published, true)))
    .orderBy(desc(schema.events.startsOn), schema.events.name)
  return { club: publicClub(club), events: rows.map(row => publicEventSummary(row)) }
})
