import { and, eq } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'
import { splitBody } from '#shared/utils/embeds'
import type { DbTx } from './events'

// Breakdowns as readers see them: on the club site, in the feeds and in the sitemap. Only live
// posts (published, their time passed); a scheduled post does not exist for readers before then.

type Club = typeof schema.clubs.$inferSelect

export const FEED_SIZE = 20

export function publicPostSummary(club: Pick<Club, 'slug'>, post: LivePost) {
  return {
    slug: post.slug,
    title: post.title,
    summary: post.summary,
    publishedAt: post.publishedAt!,
    updatedAt: post.updatedAt,
    authorName: post.authorName,
    url: appLink(postPath(club.slug, post.slug)),
  }
}

/** The link-preview card of a post: its first card embed, else its event's card; null without either. */
export async function postCardImage(db: DbTx, club: Club, post: Pick<LivePost, 'body' | 'eventId'>): Promise<string | null> {
  for (const part of splitBody(post.body)) {
    if (part.type === 'embed' && part.embed?.kind === 'card') return appLink(publicCardPath(club.slug, part.embed.subject, part.embed.id))
  }
  if (post.eventId === null) return null
  const e = schema.events
  const [ev] = await db.select({ slug: e.slug }).from(e).where(and(eq(e.id, post.eventId), eq(e.published, true)))
  return ev ? appLink(publicCardPath(club.slug, 'event', ev.slug)) : null
}

const feedParams = z.object({ slug: slugSchema })

/** A feed's club and its newest live breakdowns, each with its body rendered as on the site. */
export async function feedEntries(event: H3Event) {
  const { slug: clubSlug } = validParams(event, feedParams)
  const db = useDb()
  const club = await findPublicClub(db, clubSlug)
  const posts = await livePosts(db, club.id, FEED_SIZE)
  const entries = await Promise.all(posts.map(async post => ({ ...publicPostSummary(club, post), html: await renderPostBody(club, post.body) })))
  return { club, site: appLink(`/site/${club.slug}`), entries }
}
