import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'
import { subscriptionTokenSchema } from '#shared/schemas/subscriptions'

const params = z.object({ clubSlug: slugSchema })

/** The link of the confirmation mail: the reader gets breakdowns from now on. */
export default defineEventHandler(async (event) => {
  const { clubSlug } = validParams(event, params)
  const { token } = await validBody(event, subscriptionTokenSchema)
  const club = await findSiteClub(clubSlug)
  const reader = await confirmSubscription(club, token)
  if (!reader) {
    throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'token: This link has expired or was replaced by a newer one. Subscribe again to get a new link.', data: { fields: { token: 'This link has expired or was replaced by a newer one' } } })
  }
  return { status: reader.status, email: reader.email, club: { name: club.name, slug: club.slug } }
})
