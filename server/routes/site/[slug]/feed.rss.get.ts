// RSS 2.0 (RSS Advisory Board): the channel's title, link and description are required; each item
// has a title and a description, here the rendered breakdown in content:encoded beside its summary.
export default defineEventHandler(async (event) => {
  const { club, site, entries } = await feedEntries(event)
  const items = entries.map((p) => {
    return [
      '<item>',
      `<title>${escapeMarkup(p.title)}</title>`,
      `<link>${escapeMarkup(p.url)}</link>`,
      `<guid isPermaLink="true">${escapeMarkup(p.url)}</guid>`,
      `<pubDate>${p.publishedAt.toUTCString()}</pubDate>`,
      p.authorName ? `<dc:creator>${escapeMarkup(p.authorName)}</dc:creator>` : '',
      `<description>${escapeMarkup(p.summary || p.title)}</description>`,
      `<content:encoded>${escapeMarkup(p.html)}</content:encoded>`,
      '</item>',
    ].join('')
  })
  const built = entries[0]?.publishedAt ?? club.updatedAt
  setResponseHeader(event, 'content-type', 'application/rss+xml; charset=utf-8')
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<rss version="2.0" xmlns:atom="http://www.w3.org/2005/Atom" xmlns:content="http://purl.org/rss/1.0/modules/content/" xmlns:dc="http://purl.org/dc/elements/1.1/">',
    '<channel>',
    `<title>${escapeMarkup(`${club.name}: breakdowns`)}</title>`,
    `<link>${escapeMarkup(site)}</link>`,
    `<description>${escapeMarkup(`Fight breakdowns and results from ${club.name}`)}</description>`,
    '<language>en</language>',
    `<lastBuildDate>${built.toUTCString()}</lastBuildDate>`,
    `<atom:link href="${escapeMarkup(appLink(`/site/${club.slug}/feed.rss`))}" rel="self" type="application/rss+xml"/>`,
    ...items,
    '</channel>',
    '</rss>',
  ].join('\n')
})
