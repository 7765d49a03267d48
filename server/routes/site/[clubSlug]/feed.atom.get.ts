import { z } from 'zod'
import { slugSchema } from '#shared/schemas/club'

const params = z.object({ clubSlug: slugSchema })

// Atom (RFC 4287): the feed and every entry carry exactly one id, title and updated; the feed's
// author (the club) stands for entries without a writer of their own.
export default defineEventHandler(async (event) => {
  const { clubSlug } = validParams(event, params)
  const db = useDb()
  const club = await findPublicClub(db, clubSlug)
  const posts = await livePosts(db, club.id, FEED_SIZE)
  const site = appLink(`/site/${club.slug}`)
  const self = appLink(`/site/${club.slug}/feed.atom`)
  const entries = await Promise.all(posts.map(async (post) => {
    const p = publicPostSummary(club, post)
    const html = await renderPostBody(club, post.body)
    const updated = p.updatedAt > p.publishedAt ? p.updatedAt : p.publishedAt
    return [
      '<entry>',
      `<id>${escapeXml(p.url)}</id>`,
      `<title type="text">${escapeXml(p.title)}</title>`,
      `<updated>${updated.toISOString()}</updated>`,
      `<published>${p.publishedAt.toISOString()}</published>`,
      `<link rel="alternate" type="text/html" href="${escapeXml(p.url)}"/>`,
      `<author><name>${escapeXml(p.authorName ?? club.name)}</name></author>`,
      p.summary ? `<summary type="text">${escapeXml(p.summary)}</summary>` : '',
      `<content type="html">${escapeXml(html)}</content>`,
      '</entry>',
    ].join('')
  }))
  const updated = posts.reduce((max, post) => {
    const at = post.updatedAt > post.publishedAt! ? post.updatedAt : post.publishedAt!
    return at > max ? at : max
  }, posts.length > 0 ? new Date(0) : club.updatedAt)
  setResponseHeader(event, 'content-type', 'application/atom+xml; charset=utf-8')
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<feed xmlns="http://www.w3.org/2005/Atom">',
    `<id>${escapeXml(site)}</id>`,
    `<title type="text">${escapeXml(`${club.name}: breakdowns`)}</title>`,
    `<subtitle type="text">${escapeXml(`Fight breakdowns and results from ${club.name}`)}</subtitle>`,
    `<updated>${updated.toISOString()}</updated>`,
    `<link rel="self" type="application/atom+xml" href="${escapeXml(self)}"/>`,
    `<link rel="alternate" type="text/html" href="${escapeXml(site)}"/>`,
    `<author><name>${escapeXml(club.name)}</name></author>`,
    ...entries,
    '</feed>',
  ].join('\n')
})
