import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'
import { subscribeSchema } from '#shared/schemas/subscriptions'

const params = z.object({ slug: slugSchema })

// The subscribe form without JavaScript: a plain form POST, answered with the form's page and
// the answer (or the field's problem) in its address.
export default defineEventHandler(async (event) => {
  const { slug } = validParams(event, params)
  const club = await findSiteClub(slug)
  const page = `/site/${club.slug}/subscribe`
  try {
    const { email } = await validFormBody(event, subscribeSchema)
    await requestSubscription(event, club, email)
  }
  catch (err) {
    const status = (err as { statusCode?: number }).statusCode ?? 500
    if (status !== 400 && status !== 415 && status !== 429) throw err
    const fields = (err as { data?: { fields?: Record<string, string> } }).data?.fields
    const problem = fields?.email ?? (err as Error).message
    return sendRedirect(event, `${page}?error=${encodeURIComponent(problem)}`, 303)
  }
  return sendRedirect(event, `${page}?sent=1`, 303)
})
