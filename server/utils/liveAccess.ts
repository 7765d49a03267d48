import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'
import { MAX_RINGS } from '#shared/schemas/tournament'
import type { DbTx } from './events'

// Who may follow which stream: an overlay by its ring's read-only token, a club's members the
// whole event, anyone a published event. Tokens are only ever read here, by GET routes.

export const overlayTokenSchema = z.string({ error: 'token: missing' }).regex(/^[0-9a-f]{64}$/, { error: 'token: not an overlay token' })
export const tokenParams = z.object({ token: overlayTokenSchema })
export const publicEventParams = z.object({ clubSlug: slugSchema, eventSlug: slugSchema })

const lastEventIdQuery = z.object({ lastEventId: z.string().max(400).optional() }).loose()

/** The ring an overlay token opens; 404 for a token that never was or was rotated away. */
export async function ringByToken(token: string) {
  const r = schema.ringStates
  const [row] = await useDb().select({ eventId: r.eventId, ring: r.ringNumber, event: schema.events })
    .from(r).innerJoin(schema.events, eq(schema.events.id, r.eventId)).where(eq(r.overlayToken, token))
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This overlay address is not valid any more; copy the new one from the cue desk' })
  return row
}

/** A published event by its club's and its own address; 404 otherwise. */
export async function publishedEvent(clubSlug: string, eventSlug: string) {
  const e = schema.events
  const [row] = await useDb().select({ event: e }).from(e).innerJoin(schema.clubs, eq(schema.clubs.id, e.clubId))
    .where(and(eq(schema.clubs.slug, clubSlug), eq(e.slug, eventSlug), eq(e.published, true)))
  if (!row) throw notFoundError('Event')
  return row.event
}

/** The position a reconnecting client sends: the Last-Event-ID header, or `lastEventId` in the query for a fresh EventSource. */
export function lastEventId(event: H3Event): string | null {
  const header = getRequestHeader(event, 'last-event-id')
  if (header) return header
  return validQuery(event, lastEventIdQuery).lastEventId ?? null
}

export const allRings = (count: number) => Array.from({ length: count }, (_, i) => i + 1)

export const ringParams = eventParams.extend({
  ring: z.coerce.number({ error: 'ring: use a ring number' }).int({ error: 'ring: use a whole number' })
    .min(1, { error: 'ring: rings start at 1' }).max(MAX_RINGS, { error: `ring: at most ${MAX_RINGS} rings` }),
})

/** The event of a ring route, with the ring checked against the event's number of rings. */
export async function findRing(db: DbTx, ids: { clubId: number, eventId: number, ring: number }) {
  const row = await findEvent(db, ids.clubId, ids.eventId)
  if (ids.ring > row.rings) throw notFoundError(`Ring ${ids.ring}`)
  return row
}

/** The overlay's address for a token, relative to the app. */
export const overlayPath = (token: string) => `/overlay/${token}`
