import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'

// The link preview (Open Graph image, 1200×630) of a public event, match or fighter page. Only
// published events are shown; the card is drawn once and then served from the store.
const params = z.object({
  clubSlug: slugSchema,
  subject: z.enum(PUBLIC_CARD_SUBJECTS, { error: 'Unknown page' }),
  file: z.string().regex(/^[a-z0-9-]{1,64}\.png$/, { error: 'Unknown file' }).transform(f => f.slice(0, -4)),
})

export default defineEventHandler(async (event) => {
  const { clubSlug, subject, file } = validParams(event, params)
  const { club, data } = await useDb().transaction(tx => publicCardData(tx, clubSlug, subject, file))
  const card = await produceCard(club.id, cardInput(data, 'link', await cardBrand(club)), { keepPng: true })
  setResponseHeaders(event, {
    'content-type': 'image/png',
    'cache-control': 'public, max-age=600',
    'x-content-type-options': 'nosniff',
  })
  return Buffer.from(card.png!)
})
