import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'

const params = z.object({ clubSlug: slugSchema })

// RSS 2.0 (RSS Advisory Board): the channel's title, link and description are required; each item
// has a title and a description, here the rendered breakdown in content:encoded beside its summary.
export default defineEventHandler(async (event) => {
  const { clubSlug } = validParams(event, params)
  const db = useDb()
  const club = await findPublicClub(db, clubSlug)
  const posts = await livePosts(db, club.id, FEED_SIZE)
  const site = appLink(`/site/${club.slug}`)
  const items = await Promise.all(posts.map(async (post) => {
    const p = publicPostSummary(club, post)
    const html = await renderPostBody(club, post.body)
    return [
      '<item>',
      `<title>${escapeXml(p.title)}</title>`,
      `<link>${escapeXml(p.url)}</link>`,
      `<guid isPermaLink="true">${escapeXml(p.url)}</guid>`,
      `<pubDate>${p.publishedAt.toUTCString()}</pubDate>`,
      p.authorName ? `<dc:creator>${escapeXml(p.authorName)}</dc:creator>` : '',
      `<description>${escapeXml(p.summary || p.title)}</description>`,
      `<content:encoded>${escapeXml(html)}</content:encoded>`,
      '</item>',
    ].join('')
  }))
  const built = posts[0]?.publishedAt ?? club.updatedAt
  setResponseHeader(event, 'content-type', 'application/rss+xml; charset=utf-8')
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<rss version="2.0" xmlns:atom="http://www.w3.org/2005/Atom" xmlns:content="http://purl.org/rss/1.0/modules/content/" xmlns:dc="http://purl.org/dc/elements/1.1/">',
    '<channel>',
    `<title>${escapeXml(`${club.name}: breakdowns`)}</title>`,
    `<link>${escapeXml(site)}</link>`,
    `<description>${escapeXml(`Fight breakdowns and results from ${club.name}`)}</description>`,
    '<language>en</language>',
    `<lastBuildDate>${built.toUTCString()}</lastBuildDate>`,
    `<atom:link href="${escapeXml(appLink(`/site/${club.slug}/feed.rss`))}" rel="self" type="application/rss+xml"/>`,
    ...items,
    '</channel>',
    '</rss>',
  ].join('\n')
})
