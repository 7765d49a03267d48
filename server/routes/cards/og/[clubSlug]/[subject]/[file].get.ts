import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'
import type { CardData } from '#shared/cards/types'

// The link preview (Open Graph image, 1200×630) of a public event, match or fighter page. Only
// published events are shown; the card is drawn once and then served from the store.
const params = z.object({
  clubSlug: slugSchema,
  subject: z.enum(PUBLIC_CARD_SUBJECTS, { error: 'Unknown page' }),
  file: z.string().regex(/^[a-z0-9-]{1,64}\.png$/, { error: 'Unknown file' }).transform(f => f.slice(0, -4)),
})

const number = (id: string) => {
  if (!/^\d{1,10}$/.test(id)) throw notFoundError('Card')
  return Number(id)
}

export default defineEventHandler(async (event) => {
  const { clubSlug, subject, file } = validParams(event, params)
  const { club, data } = await useDb().transaction(async (tx): Promise<{ club: typeof schema.clubs.$inferSelect, data: CardData }> => {
    if (subject === 'event') {
      const club = await findPublicClub(tx, clubSlug)
      const ev = await findPublishedEvent(tx, club, file)
      return { club, data: await eventSummaryData(tx, club, ev) }
    }
    if (subject === 'match') {
      const { club, event: ev, view, row } = await findPublicMatch(tx, clubSlug, number(file))
      // A match still to be fenced shows its event instead.
      return { club, data: hasResult(row) ? view : await eventSummaryData(tx, club, ev) }
    }
    const { club, results, latest } = await findPublicFighter(tx, clubSlug, number(file))
    const summary = results.find(r => r.summary)?.summary
    return { club, data: summary ?? await eventSummaryData(tx, club, latest.event) }
  })
  const card = await produceCard(club.id, cardInput(data, 'link', await cardBrand(club)), { keepPng: true })
  setResponseHeaders(event, {
    'content-type': 'image/png',
    'cache-control': 'public, max-age=600',
    'x-content-type-options': 'nosniff',
  })
  return Buffer.from(card.png!)
})
