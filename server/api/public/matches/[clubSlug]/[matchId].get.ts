import { z } from 'zod'
import { idParamSchema, slugSchema } from '#shared/schemas/club'

const params = z.object({ clubSlug: slugSchema, matchId: idParamSchema })

/** A match of a published event for the club site: fighters, clubs, the bout strip and the score. */
export default defineEventHandler(async (event) => {
  const { clubSlug, matchId } = validParams(event, params)
  return useDb().transaction(async (tx) => {
    const { club, event: ev, source, row, view } = await findPublicMatch(tx, clubSlug, matchId)
    const side = (entryId: number) => {
      const ref = source.refs.get(entryId)!
      return { fighterId: ref.fighterId, name: ref.name, clubName: ref.clubName }
    }
    return {
      club: publicClub(club),
      event: { ...publicEventSummary(ev), safety: { emergencyNumber: ev.emergencyNumber, firstAidPoint: ev.firstAidPoint } },
      tournament: { id: source.tournament.id, name: source.tournament.name, weapon: source.tournament.weapon },
      match: {
        id: row.id,
        stage: view.stage,
        format: view.format,
        status: view.status,
        a: side(row.sideAEntry!),
        b: side(row.sideBEntry!),
        score: view.score,
        result: view.result,
        forfeitedBy: view.forfeitedBy,
        bouts: view.bouts,
      },
      openGraph: openGraphLinks(club.slug, 'match', row.id),
    }
  })
})
