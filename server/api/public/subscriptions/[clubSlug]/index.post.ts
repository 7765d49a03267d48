import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'
import { subscribeSchema } from '#shared/schemas/subscriptions'

const params = z.object({ clubSlug: slugSchema })

/** A reader asks for the club's breakdowns by e-mail; the same answer whether or not the address is known. */
export default defineEventHandler(async (event) => {
  const { clubSlug } = validParams(event, params)
  const { email } = await validBody(event, subscribeSchema)
  const club = await findSiteClub(clubSlug)
  await requestSubscription(event, club, email)
  setResponseStatus(event, 202)
  return { message: SUBSCRIBE_ANSWER }
})
