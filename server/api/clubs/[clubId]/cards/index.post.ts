import { cardRequestSchema } from '#shared/schemas/cards'
import { cardAltText, defaultCaption, defaultHeadline } from '#shared/cards/text'

/**
 * One card for the studio's preview: found in the store or drawn and stored, with where to load
 * and download it, its words and the alt text written from its data.
 */
export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, ['editor'])
  const body = await validBody(event, cardRequestSchema)
  const { data, club } = await useDb().transaction(async (tx) => {
    const row = await findCardTournament(tx, clubId, body.tournamentId)
    const source = await loadCardSource(tx, row)
    return { data: cardData(source, body.kind, body.subjectId ?? null), club: row.club }
  })
  const input = cardInput(data, body.size, await cardBrand(club), { headline: body.headline, caption: body.caption })
  const card = await produceCard(clubId, input)
  const url = `/media/cards/${clubId}/${card.hash}.png`
  setResponseHeader(event, 'x-card-cache', card.cached ? 'hit' : 'miss')
  return {
    hash: card.hash,
    url,
    downloadUrl: `${url}?download=1`,
    width: card.width,
    height: card.height,
    cached: card.cached,
    headline: input.headline,
    caption: input.caption,
    defaults: { headline: defaultHeadline(data), caption: defaultCaption(data) },
    alt: cardAltText(input),
  }
})
