import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'

const params = z.object({ clubSlug: slugSchema, eventSlug: slugSchema })

/** A published event with its tournaments; an unpublished one is not found. */
export default defineEventHandler(async (event) => {
  const { clubSlug, eventSlug } = validParams(event, params)
  const db = useDb()
  const [row] = await db.select({ event: schema.events, club: schema.clubs }).from(schema.events)
    .innerJoin(schema.clubs, eq(schema.clubs.id, schema.events.clubId))
    .where(and(eq(schema.clubs.slug, clubSlug), eq(schema.events.slug, eventSlug), eq(schema.events.published, true)))
  if (!row) throw notFoundError('Event')
  const tournaments = await tournamentsOf(db, [row.event.id])
  return {
    club: publicClub(row.club),
    event: {
      ...publicEventSummary(row.event),
      safety: { emergencyNumber: row.event.emergencyNumber, firstAidPoint: row.event.firstAidPoint },
    },
    tournaments: tournaments.map(t => ({
      id: t.id,
      name: t.name,
      weapon: t.weapon,
      phase: t.phase,
      // Withdrawn fighters are not counted: this is the field as it stands.
      entries: t.entries.entered + t.entries.checkedIn,
    })),
    openGraph: openGraphLinks(row.club.slug, 'event', row.event.slug),
  }
})
