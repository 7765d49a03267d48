import { randomBytes } from 'node:crypto'
import { and, eq, inArray } from 'drizzle-orm'
import { PNG } from 'pngjs'
import { afterAll, describe, expect, it } from 'vitest'
import type { TestClub } from '../support/fixtures'
import { db, makeClub, pool, schema } from '../support/fixtures'
import { BASE_URL, Client, INBOX_URL } from '../support/http'
import { as, clean, drawPools, fenceMatch, makeFixture, matchBetween, record, sideOf } from '../support/tournament'

// Readers' subscriptions and mailings against the built app, PostgreSQL, the fake SMTP with its
// inbox, and the worker process the test command starts (it announces posts and runs the
// mailing jobs). All names and addresses are invented.

afterAll(() => pool.end())

interface Mail {
  id: string
  to: string[]
  subject: string
  date: string
  text: string
  html: string | null
  headers: Record<string, string>
  attachments: { filename: string | null, contentType: string, contentId: string | null, size: number, content: string }[]
}

const reader = (label: string) => `${label}-${randomBytes(4).toString('hex')}@readers.example`
const sleep = (ms: number) => new Promise(resolve => setTimeout(resolve, ms))

async function mailTo(address: string): Promise<Mail[]> {
  const res = await fetch(new URL(`/messages?to=${encodeURIComponent(address)}`, INBOX_URL))
  return (await res.json() as { messages: Mail[] }).messages
}

/** Waits for a mail to an address whose subject passes `match`. */
async function waitFor(address: string, match: (subject: string) => boolean, timeoutMs = 15_000): Promise<Mail> {
  const until = Date.now() + timeoutMs
  for (;;) {
    const found = (await mailTo(address)).find(m => match(m.subject))
    if (found) return found
    if (Date.now() > until) throw new Error(`no matching mail to ${address} within ${timeoutMs} ms`)
    await sleep(150)
  }
}

const subscribe = (club: TestClub, email: string, client = new Client()) =>
  client.post(`/api/public/subscriptions/${club.slug}`, { email })

function confirmToken(mail: Mail): string {
  const match = /\/subscribe\/confirm\?token=([A-Za-z0-9_-]+)/.exec(mail.text)
  if (!match) throw new Error(`no confirmation link in: ${mail.text}`)
  return match[1]!
}

/** Subscribes and confirms through the mailed link; answers the reader's row. */
async function confirmedReader(club: TestClub, email: string) {
  expect((await subscribe(club, email)).status).toBe(202)
  const token = confirmToken(await waitFor(email, s => s.startsWith('Confirm your subscription')))
  const confirmed = await new Client().post(`/api/public/subscriptions/${club.slug}/confirm`, { token })
  expect(confirmed.status, JSON.stringify(confirmed.data)).toBe(200)
  return subscriberRow(club, email)
}

async function subscriberRow(club: TestClub, email: string) {
  const [row] = await db.select().from(schema.subscribers)
    .where(and(eq(schema.subscribers.clubId, club.id), eq(schema.subscribers.email, email)))
  return row!
}

let postCount = 0
/** A breakdown post written straight into the table, as the publishing part leaves it. */
async function insertPost(club: TestClub, publishedAt: Date, status: 'published' | 'draft' = 'published') {
  postCount += 1
  const slug = `harvest-breakdown-${postCount}-${randomBytes(3).toString('hex')}`
  const [post] = await db.insert(schema.posts).values({
    clubId: club.id, slug, title: `Pool two, bout by bout (${slug})`, summary: 'How the afterblows decided the second pool.', status, publishedAt,
  }).returning()
  return post!
}

async function waitForMailing(where: ReturnType<typeof eq>, done = true, timeoutMs = 20_000) {
  const until = Date.now() + timeoutMs
  for (;;) {
    const [row] = await db.select().from(schema.mailings).where(where)
    if (row && (!done || row.status === 'done' || row.status === 'failed')) return row
    if (Date.now() > until) throw new Error(`the mailing did not finish within ${timeoutMs} ms: ${JSON.stringify(row)}`)
    await sleep(200)
  }
}

describe('subscribing with double opt-in', () => {
  it('mails a confirmation link, and opening it confirms the reader', async () => {
    const club = await makeClub('mail')
    const email = reader('ada')
    const res = await subscribe(club, email)
    expect(res.status).toBe(202)
    expect((await subscriberRow(club, email)).status).toBe('pending')

    const mail = await waitFor(email, s => s === `Confirm your subscription to ${club.name}`)
    expect(mail.html).toContain('Confirm my subscription')
    const token = confirmToken(mail)
    // The page of the link confirms on the server, so it works without JavaScript.
    const page = await fetch(new URL(`/site/${club.slug}/subscribe/confirm?token=${token}`, BASE_URL))
    expect(page.status).toBe(200)
    expect(await page.text()).toContain('You are subscribed.')
    const row = await subscriberRow(club, email)
    expect(row.status).toBe('confirmed')
    expect(row.confirmedAt).not.toBeNull()
  })

  it('answers the same for a new, a pending and a confirmed address, and mails a confirmed reader nothing more', async () => {
    const club = await makeClub('mail')
    const known = reader('known')
    await confirmedReader(club, known)
    const before = (await mailTo(known)).length
    const again = await subscribe(club, known)
    const fresh = await subscribe(club, reader('fresh'))
    expect(again.status).toBe(202)
    expect(again.data).toEqual(fresh.data)
    await sleep(700)
    expect((await mailTo(known)).length).toBe(before)
  })

  it('sends a second confirmation to a pending reader only after a minute', async () => {
    const club = await makeClub('mail')
    const email = reader('twice')
    await subscribe(club, email)
    await waitFor(email, s => s.startsWith('Confirm'))
    expect((await subscribe(club, email)).status).toBe(202)
    await sleep(700)
    expect((await mailTo(email)).length).toBe(1)
  })

  it('refuses a bad address, extra fields and non-JSON with a message naming the field, and an unknown club with 404', async () => {
    const club = await makeClub('mail')
    const bad = await subscribe(club, 'not-an-address')
    expect(bad.status).toBe(400)
    expect(bad.data.data.fields.email).toMatch(/valid e-mail/)
    const extra = await new Client().post(`/api/public/subscriptions/${club.slug}`, { email: reader('x'), name: 'Nell' })
    expect(extra.status).toBe(400)
    expect(extra.data.data.fields.body).toMatch(/name/)
    const text = await new Client().request('POST', `/api/public/subscriptions/${club.slug}`, { body: 'email=a@b.example', headers: { 'content-type': 'text/plain' } })
    expect(text.status).toBe(415)
    expect((await new Client().post(`/api/public/subscriptions/no-such-club-${randomBytes(3).toString('hex')}`, { email: reader('y') })).status).toBe(404)
    const slug = await new Client().post('/api/public/subscriptions/Not%20A%20Slug', { email: reader('z') })
    expect(slug.status).toBe(400)
    expect(slug.data.data.fields.clubSlug).toBeTruthy()

    const badToken = await new Client().post(`/api/public/subscriptions/${club.slug}/confirm`, { token: 'short' })
    expect(badToken.status).toBe(400)
    expect(badToken.data.data.fields.token).toBeTruthy()
    const unknown = await new Client().post(`/api/public/subscriptions/${club.slug}/confirm`, { token: randomBytes(32).toString('base64url') })
    expect(unknown.status).toBe(404)
  })

  it('throttles sign-ups from one network: the eleventh within 15 minutes for a club answers 429 with Retry-After', async () => {
    const club = await makeClub('mail')
    for (let i = 0; i < 10; i++) expect((await subscribe(club, reader(`t${i}`))).status).toBe(202)
    const refused = await subscribe(club, reader('t10'))
    expect(refused.status).toBe(429)
    expect(refused.headers.get('retry-after')).toBe('900')
    expect(refused.data.data.fields.email).toMatch(/Too many/)
    // Another club's form is not held up by this one's.
    expect((await subscribe(await makeClub('mail'), reader('other'))).status).toBe(202)
  })

  it('takes the form without JavaScript: a plain form POST, answered by a redirect to the page with the answer or the problem', async () => {
    const club = await makeClub('mail')
    const email = reader('nojs')
    const post = (body: string) => fetch(new URL(`/site/${club.slug}/subscribe`, BASE_URL), {
      method: 'POST', body, redirect: 'manual', headers: { 'content-type': 'application/x-www-form-urlencoded', 'accept': 'text/html' },
    })
    const ok = await post(`email=${encodeURIComponent(email)}`)
    expect(ok.status).toBe(303)
    expect(ok.headers.get('location')).toBe(`/site/${club.slug}/subscribe?sent=1`)
    await waitFor(email, s => s.startsWith('Confirm'))
    const bad = await post('email=nope')
    expect(bad.status).toBe(303)
    expect(decodeURIComponent(bad.headers.get('location')!)).toContain('error=Enter a valid e-mail address')
    const page = await fetch(new URL(`/site/${club.slug}/subscribe?sent=1`, BASE_URL))
    expect(await page.text()).toContain('a message with a confirmation link is on its way')
  })
})

describe('mailing breakdowns', () => {
  it('mails a published post to confirmed readers only, with one-click unsubscribe headers (RFC 8058)', async () => {
    const club = await makeClub('mail')
    const confirmed = reader('confirmed')
    const pending = reader('pending')
    const row = await confirmedReader(club, confirmed)
    await subscribe(club, pending)
    await waitFor(pending, s => s.startsWith('Confirm'))

    const post = await insertPost(club, new Date(Date.now() - 60_000))
    const mail = await waitFor(confirmed, s => s === post.title)
    const unsubscribe = `${BASE_URL}/site/${club.slug}/unsubscribe/${row.unsubscribeToken}`
    // RFC 8058 section 3.1: List-Unsubscribe holds an HTTPS (here the test's HTTP) URI and
    // List-Unsubscribe-Post exactly "List-Unsubscribe=One-Click".
    expect(mail.headers['list-unsubscribe']).toBe(`<${unsubscribe}>`)
    expect(mail.headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click')
    expect(mail.text).toContain(`${BASE_URL}/site/${club.slug}/posts/${post.slug}`)
    expect(mail.text).toContain(post.summary)
    expect(mail.html).toContain(`href="${BASE_URL}/site/${club.slug}/posts/${post.slug}"`)
    expect(mail.html).toContain(post.summary)

    const mailing = await waitForMailing(eq(schema.mailings.postId, post.id))
    expect(mailing).toMatchObject({ kind: 'post', status: 'done', total: 1, sent: 1, failed: 0 })
    expect((await mailTo(pending)).filter(m => m.subject === post.title)).toEqual([])
    const [announced] = await db.select().from(schema.posts).where(eq(schema.posts.id, post.id))
    expect(announced!.announcedAt).not.toBeNull()
  })

  it('unsubscribes on the one-click POST, shows only a button on GET, and mails that reader nothing later', async () => {
    const club = await makeClub('mail')
    const email = reader('leaving')
    const stays = reader('staying')
    const row = await confirmedReader(club, email)
    await confirmedReader(club, stays)
    const url = new URL(`/site/${club.slug}/unsubscribe/${row.unsubscribeToken}`, BASE_URL)

    // A link scanner's GET changes nothing: the page only offers the button (a plain form).
    const page = await fetch(url)
    expect(page.status).toBe(200)
    const html = await page.text()
    expect(html).toMatch(/<form[^>]*method="post"/)
    expect(html).toContain('name="List-Unsubscribe" value="One-Click"')
    expect((await subscriberRow(club, email)).status).toBe('confirmed')

    // Refused without the one-click body (RFC 8058 section 3.2).
    const wrong = await fetch(url, { method: 'POST', body: 'List-Unsubscribe=Later', headers: { 'content-type': 'application/x-www-form-urlencoded' } })
    expect(wrong.status).toBe(400)
    expect(await wrong.text()).toContain('List-Unsubscribe')
    const json = await fetch(url, { method: 'POST', body: '{}', headers: { 'content-type': 'application/json' } })
    expect(json.status).toBe(415)
    expect((await subscriberRow(club, email)).status).toBe('confirmed')

    const oneClick = await fetch(url, { method: 'POST', body: 'List-Unsubscribe=One-Click', headers: { 'content-type': 'application/x-www-form-urlencoded' } })
    expect(oneClick.status).toBe(200)
    expect((await subscriberRow(club, email)).status).toBe('unsubscribed')
    // A mail client may send it as multipart/form-data; a second time changes nothing.
    const form = new FormData()
    form.set('List-Unsubscribe', 'One-Click')
    expect((await fetch(url, { method: 'POST', body: form })).status).toBe(200)

    const post = await insertPost(club, new Date(Date.now() - 1000))
    await waitFor(stays, s => s === post.title)
    const mailing = await waitForMailing(eq(schema.mailings.postId, post.id))
    expect(mailing.sent).toBe(1)
    expect((await mailTo(email)).filter(m => m.subject === post.title)).toEqual([])
  })

  it('sends each message once when the mailing job runs again', async () => {
    const club = await makeClub('mail')
    const emails = [reader('once-a'), reader('once-b')]
    for (const email of emails) await confirmedReader(club, email)
    const post = await insertPost(club, new Date(Date.now() - 1000))
    const first = await waitForMailing(eq(schema.mailings.postId, post.id))
    expect(first.sent).toBe(2)

    // As if the job were retried: the mailing goes back on the queue and runs a second time.
    await db.update(schema.mailings).set({ status: 'queued', jobId: null, finishedAt: null }).where(eq(schema.mailings.id, first.id))
    const until = Date.now() + 20_000
    for (;;) {
      const [row] = await db.select().from(schema.mailings).where(eq(schema.mailings.id, first.id))
      if (row!.status === 'done' && row!.jobId !== first.jobId && row!.jobId !== null) break
      if (Date.now() > until) throw new Error(`the second run did not finish: ${JSON.stringify(row)}`)
      await sleep(200)
    }
    await sleep(500)
    for (const email of emails) expect((await mailTo(email)).filter(m => m.subject === post.title)).toHaveLength(1)
    const deliveries = await db.select().from(schema.mailDeliveries).where(eq(schema.mailDeliveries.mailingId, first.id))
    expect(deliveries.map(d => d.status)).toEqual(['sent', 'sent'])
  })

  it('mails a scheduled post only once its time has come, and never a draft', async () => {
    const club = await makeClub('mail')
    const email = reader('scheduled')
    await confirmedReader(club, email)
    const at = new Date(Date.now() + 5000)
    const scheduled = await insertPost(club, at)
    const draft = await insertPost(club, new Date(Date.now() - 1000), 'draft')
    // The workers look every second in the tests: three rounds pass before the time.
    await sleep(3000)
    expect((await mailTo(email)).filter(m => m.subject === scheduled.title)).toEqual([])
    const [waiting] = await db.select().from(schema.posts).where(eq(schema.posts.id, scheduled.id))
    expect(waiting!.announcedAt).toBeNull()

    const mail = await waitFor(email, s => s === scheduled.title)
    expect(new Date(mail.date).getTime()).toBeGreaterThanOrEqual(at.getTime())
    expect((await mailTo(email)).filter(m => m.subject === draft.title)).toEqual([])
    expect(await db.select().from(schema.mailings).where(eq(schema.mailings.postId, draft.id))).toEqual([])
  })

  it('asks a reader who unsubscribed to confirm again before mailing them again', async () => {
    const club = await makeClub('mail')
    const email = reader('back')
    const row = await confirmedReader(club, email)
    const firstToken = confirmToken((await mailTo(email))[0]!)
    await fetch(new URL(`/site/${club.slug}/unsubscribe/${row.unsubscribeToken}`, BASE_URL), {
      method: 'POST', body: 'List-Unsubscribe=One-Click', headers: { 'content-type': 'application/x-www-form-urlencoded' },
    })
    // The old confirmation link does not bring them back.
    expect((await new Client().post(`/api/public/subscriptions/${club.slug}/confirm`, { token: firstToken })).status).toBe(404)

    expect((await subscribe(club, email)).status).toBe(202)
    const until = Date.now() + 10_000
    while ((await mailTo(email)).filter(m => m.subject.startsWith('Confirm')).length < 2) {
      if (Date.now() > until) throw new Error('no second confirmation')
      await sleep(150)
    }
    expect((await subscriberRow(club, email)).status).toBe('pending')
    const secondToken = confirmToken((await mailTo(email))[0]!)
    expect(secondToken).not.toBe(firstToken)
    expect((await new Client().post(`/api/public/subscriptions/${club.slug}/confirm`, { token: secondToken })).status).toBe(200)
    expect((await subscriberRow(club, email)).status).toBe('confirmed')
  })
})

describe('the readers page', () => {
  it('shows counts, the list and the mailings to editors and admins, and removes a reader', async () => {
    const club = await makeClub('mail')
    const confirmed = reader('list-a')
    const pending = reader('list-b')
    const row = await confirmedReader(club, confirmed)
    await subscribe(club, pending)
    const editor = await as(club, 'editor')
    const res = await editor.get(`/api/clubs/${club.id}/readers`)
    expect(res.status).toBe(200)
    expect(res.data.counts).toEqual({ pending: 1, confirmed: 1, unsubscribed: 0 })
    expect(res.data.readers.map((r: { email: string }) => r.email).sort()).toEqual([confirmed, pending].sort())
    expect(res.data.mailings).toEqual([])
    expect((await (await as(club, 'admin')).get(`/api/clubs/${club.id}/readers`)).status).toBe(200)
    expect((await (await as(club, 'organizer')).get(`/api/clubs/${club.id}/readers`)).status).toBe(403)
    expect((await new Client().get(`/api/clubs/${club.id}/readers`)).status).toBe(401)
    const other = await makeClub('mail')
    expect((await (await as(other, 'editor')).get(`/api/clubs/${club.id}/readers`)).status).toBe(404)
    expect((await (await as(other, 'editor')).delete(`/api/clubs/${other.id}/readers/${row.id}`)).status).toBe(404)

    expect((await editor.delete(`/api/clubs/${club.id}/readers/${row.id}`)).status).toBe(204)
    expect((await editor.delete(`/api/clubs/${club.id}/readers/${row.id}`)).status).toBe(404)
    expect((await editor.delete(`/api/clubs/${club.id}/readers/abc`)).status).toBe(400)
    const after = await editor.get(`/api/clubs/${club.id}/readers`)
    expect(after.data.counts).toEqual({ pending: 1, confirmed: 0, unsubscribed: 0 })
  })
})

describe('result cards by e-mail', () => {
  it('mails each fighter with an address their 1080×1080 pool-summary card with its alt text, once per fighter', async () => {
    const club = await makeClub('mail')
    const organizer = await as(club, 'organizer')
    const fighters = [
      { name: 'Hedda Crane', clubName: 'Ironquay Fencing Hall' },
      { name: 'Alder Mossley', clubName: 'North Downs Buckler Circle' },
      { name: 'Bryony Tallis', clubName: 'Lanterngate Historical Fencing' },
    ]
    const f = await makeFixture(club, organizer, { fighters, poolSize: 3, qualifyCount: 2 })
    const pools = await drawPools(f)
    const api = `${f.base}/result-mail`

    const early = await organizer.post(api)
    expect(early.status).toBe(409)
    expect(early.data.data.fields.tournamentId).toMatch(/every pool match/)
    expect((await organizer.get(api)).data).toMatchObject({ ready: false, mailing: null })

    const [a, b, c] = fighters.map(x => x.name) as [string, string, string]
    await fenceMatch(f, matchBetween(pools, a, b), a, 2)
    await fenceMatch(f, matchBetween(pools, a, c), a, 3)
    const last = matchBetween(pools, b, c)
    expect((await record(organizer, f.base, last.id, [clean(sideOf(last, b)), clean(sideOf(last, b)), clean(sideOf(last, c))])).status).toBe(201)

    // Two of the three gave an address.
    const addresses = [reader('hedda'), reader('alder')]
    const entryIds = [f.entries.get(a)!, f.entries.get(b)!]
    const rows = await db.select().from(schema.entries).where(inArray(schema.entries.id, entryIds))
    for (const [i, id] of entryIds.entries()) {
      const fighterId = rows.find(r => r.id === id)!.fighterId
      await db.update(schema.fighters).set({ email: addresses[i]! }).where(eq(schema.fighters.id, fighterId))
    }

    expect((await (await as(club, 'editor')).post(api)).status).toBe(403)
    const started = await organizer.post(api)
    expect(started.status, JSON.stringify(started.data)).toBe(202)
    expect(started.data.fightersWithEmail).toBe(2)

    const mail = await waitFor(addresses[0]!, s => s.startsWith('Your result card'), 30_000)
    expect(mail.attachments).toHaveLength(1)
    const attachment = mail.attachments[0]!
    expect(attachment.contentType).toBe('image/png')
    // Decoded with pngjs, apart from the app's encoder; it checks every chunk's CRC (PNG: ISO/IEC 15948).
    const png = PNG.sync.read(Buffer.from(attachment.content, 'base64'))
    expect([png.width, png.height]).toEqual([1080, 1080])
    expect(mail.text).toContain(`What the card shows: Result card of ${club.name}`)
    expect(mail.text).toContain('Hedda Crane (Ironquay Fencing Hall)')
    // The card is also shown in the HTML body (the inbox's parser inlines the cid: reference).
    expect(attachment.contentId).toBe('<result-card>')
    expect(/<img src="[^"]+" alt="Result card of [^"]+"/.test(mail.html ?? '')).toBe(true)
    await waitFor(addresses[1]!, s => s.startsWith('Your result card'), 30_000)

    const mailing = await waitForMailing(eq(schema.mailings.tournamentId, f.tournamentId))
    expect(mailing).toMatchObject({ kind: 'cards', status: 'done', total: 2, sent: 2 })
    const progress = await organizer.get(api)
    expect(progress.data).toMatchObject({ ready: true, mailing: { status: 'done', sent: 2, total: 2 } })

    // Asking again mails nobody twice.
    expect((await organizer.post(api)).status).toBe(202)
    await waitForMailing(eq(schema.mailings.tournamentId, f.tournamentId))
    await sleep(500)
    for (const address of addresses) expect((await mailTo(address)).filter(m => m.subject.startsWith('Your result card'))).toHaveLength(1)
  }, 90_000)
})
