// Atom (RFC 4287): the feed and every entry carry exactly one id, title and updated; the feed's
// author (the club) stands for entries without a writer of their own.
export default defineEventHandler(async (event) => {
  const { club, site, entries: posts } = await feedEntries(event)
  const self = appLink(`/site/${club.slug}/feed.atom`)
  const entries = posts.map((p) => {
    const updated = p.updatedAt > p.publishedAt ? p.updatedAt : p.publishedAt
    return [
      '<entry>',
      `<id>${escapeMarkup(p.url)}</id>`,
      `<title type="text">${escapeMarkup(p.title)}</title>`,
      `<updated>${updated.toISOString()}</updated>`,
      `<published>${p.publishedAt.toISOString()}</published>`,
      `<link rel="alternate" type="text/html" href="${escapeMarkup(p.url)}"/>`,
      `<author><name>${escapeMarkup(p.authorName ?? club.name)}</name></author>`,
      p.summary ? `<summary type="text">${escapeMarkup(p.summary)}</summary>` : '',
      `<content type="html">${escapeMarkup(p.html)}</content>`,
      '</entry>',
    ].join('')
  })
  const updated = posts.reduce((max, post) => {
    const at = post.updatedAt > post.publishedAt ? post.updatedAt : post.publishedAt
    return at > max ? at : max
  }, posts.length > 0 ? new Date(0) : club.updatedAt)
  setResponseHeader(event, 'content-type', 'application/atom+xml; charset=utf-8')
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<feed xmlns="http://www.w3.org/2005/Atom">',
    `<id>${escapeMarkup(site)}</id>`,
    `<title type="text">${escapeMarkup(`${club.name}: breakdowns`)}</title>`,
    `<subtitle type="text">${escapeMarkup(`Fight breakdowns and results from ${club.name}`)}</subtitle>`,
    `<updated>${updated.toISOString()}</updated>`,
    `<link rel="self" type="application/atom+xml" href="${escapeMarkup(self)}"/>`,
    `<link rel="alternate" type="text/html" href="${escapeMarkup(site)}"/>`,
    `<author><name>${escapeMarkup(club.name)}</name></author>`,
    ...entries,
    '</feed>',
  ].join('\n')
})
