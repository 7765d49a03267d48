import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'

const params = z.object({ clubSlug: slugSchema })
const query = z.object({ limit: z.coerce.number({ error: 'Must be a number' }).int().min(1).max(50).default(10) })

/** A club's live breakdowns, newest first. */
export default defineEventHandler(async (event) => {
  const { clubSlug } = validParams(event, params)
  const { limit } = validQuery(event, query)
  const db = useDb()
  const club = await findPublicClub(db, clubSlug)
  const posts = await livePosts(db, club.id, limit)
  return { posts: posts.map(post => publicPostSummary(club, post)) }
})
