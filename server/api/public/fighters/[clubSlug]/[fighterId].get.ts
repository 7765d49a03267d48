import { z } from 'zod'
import { idParamSchema, slugSchema } from '#shared/schemas/club'

const params = z.object({ clubSlug: slugSchema, fighterId: idParamSchema })

/** A fighter of the club's roster and their results in its published events, newest first. */
export default defineEventHandler(async (event) => {
  const { clubSlug, fighterId } = validParams(event, params)
  return useDb().transaction(async (tx) => {
    const { club, fighter, results, latest } = await findPublicFighter(tx, clubSlug, fighterId)
    return {
      club: publicClub(club),
      fighter: { id: fighter.id, name: fighter.name, clubName: fighter.clubName },
      // For the safety notice: the newest event they fenced in.
      safety: { emergencyNumber: latest.event.emergencyNumber, firstAidPoint: latest.event.firstAidPoint },
      results,
      openGraph: openGraphLinks(club.slug, 'fighter', fighter.id),
    }
  })
})
