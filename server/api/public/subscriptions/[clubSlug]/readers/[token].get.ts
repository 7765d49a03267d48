import { z } from 'zod'
import { and, eq } from 'drizzle-orm'
import { slugSchema } from '#shared/schemas/club'
import { tokenSchema } from '#shared/schemas/auth'

const params = z.object({ clubSlug: slugSchema, token: tokenSchema })

/** What the unsubscribe link's page shows: whose subscription it is and whether it is on. */
export default defineEventHandler(async (event) => {
  const { clubSlug, token } = validParams(event, params)
  const club = await findSiteClub(clubSlug)
  const s = schema.subscribers
  const [reader] = await useDb().select().from(s).where(and(eq(s.clubId, club.id), eq(s.unsubscribeToken, token)))
  if (!reader) throw notFoundError('Subscription')
  return { status: reader.status, email: reader.email, club: { name: club.name, slug: club.slug } }
})
