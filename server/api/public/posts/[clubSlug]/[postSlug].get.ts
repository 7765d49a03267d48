import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'
import { postSlugSchema } from '#shared/schemas/posts'

const params = z.object({ clubSlug: slugSchema, postSlug: postSlugSchema })

/** One live breakdown with its body rendered (embeds from live data) and its link preview. */
export default defineEventHandler(async (event) => {
  const { clubSlug, postSlug } = validParams(event, params)
  const db = useDb()
  const club = await findPublicClub(db, clubSlug)
  const post = await findLivePost(db, club.id, postSlug)
  const summary = publicPostSummary(club, post)
  const logo = logoUrl(club)
  return {
    club: publicClub(club),
    post: { ...summary, html: await renderPostBody(club, post.body) },
    openGraph: { url: summary.url, image: await postCardImage(db, club, post) ?? (logo ? appLink(logo) : null) },
  }
})
