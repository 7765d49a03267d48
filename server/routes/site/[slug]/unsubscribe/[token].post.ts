import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'
import { tokenSchema } from '#shared/schemas/auth'
import { oneClickSchema } from '#shared/schemas/subscriptions'

const params = z.object({ slug: slugSchema, token: tokenSchema })

// The address of the List-Unsubscribe header. A mail client's one-click POST (RFC 8058: body
// `List-Unsubscribe=One-Click`, form-encoded or multipart) unsubscribes without further questions;
// the page at the same address (GET) has a button whose plain form posts here too, and goes back
// to the page, which then says the reader is out.
export default defineEventHandler(async (event) => {
  const { slug, token } = validParams(event, params)
  await validFormBody(event, oneClickSchema)
  const club = await findSiteClub(slug)
  const reader = await unsubscribe(club, token)
  if (!reader) throw notFoundError('Subscription')
  if (wantsHtml(event)) return sendRedirect(event, `/site/${club.slug}/unsubscribe/${token}`, 303)
  return { status: reader.status }
})
