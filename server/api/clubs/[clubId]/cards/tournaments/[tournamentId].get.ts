import { idParamSchema } from '#shared/schemas/club'
import { CARD_SIZE_NAMES } from '#shared/cards/types'

const params = clubParams.extend({ tournamentId: idParamSchema })

/** What a tournament's cards can be about now: finished matches, fighters in the pools, pools, the tournament. */
export default defineEventHandler(async (event) => {
  const { clubId, tournamentId } = validParams(event, params)
  await requireClubRole(event, clubId, ['editor'])
  return useDb().transaction(async (tx) => {
    const row = await findCardTournament(tx, clubId, tournamentId)
    const source = await loadCardSource(tx, row)
    const subjects = cardSubjects(source).map(({ slug: _slug, ...option }) => option)
    const cards = subjects.reduce((n, s) => n + s.kinds.length, 0)
    return {
      tournament: { id: row.tournament.id, name: row.tournament.name, phase: row.tournament.phase },
      event: { id: row.event.id, name: row.event.name, published: row.event.published },
      subjects,
      // Every card of the tournament in every size: what a batch of all sizes makes.
      cardsPerSize: cards,
      sizes: CARD_SIZE_NAMES.length,
    }
  })
})
