import { hostname } from 'node:os'
import { HeadObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { PNG } from 'pngjs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CARD_SIZES, CARD_SIZE_NAMES } from '../../shared/cards/types'
import type { CardSize } from '../../shared/cards/types'
import { startSecondApp } from '../support/app'
import type { SecondApp } from '../support/app'
import type { TestClub } from '../support/fixtures'
import { PASSWORD, db, makeClub, pool, schema, tableCounts } from '../support/fixtures'
import { BASE_URL, Client } from '../support/http'
import type { Fixture, MatchView } from '../support/tournament'
import { as, clean, double, drawPools, fenceMatch, makeFixture, matchBetween, record, sideOf } from '../support/tournament'
import { readZip } from '../support/zip'

// Cards against the built app, PostgreSQL, the fake S3 and the worker process the test command
// starts beside the app (it runs the batch jobs). All names are invented.

let club: TestClub
let organizer: Client
let editor: Client
let f: Fixture
const cards = () => `/api/clubs/${club.id}/cards`

const FOUR = [
  { name: 'Hedda Crane', clubName: 'Ironquay Fencing Hall' },
  { name: 'Alder Mossley', clubName: 'North Downs Buckler Circle' },
  { name: 'Bryony Tallis', clubName: 'Lanterngate Historical Fencing' },
  { name: 'Cobb Wetherell', clubName: 'Greyfield Sword Society' },
]
const RANKED = FOUR.map(x => x.name)

// Decoded with pngjs, written apart from the app's encoder; it checks every chunk's CRC
// (PNG: ISO/IEC 15948).
const decode = (bytes: ArrayBuffer | Buffer) => PNG.sync.read(Buffer.from(bytes as ArrayBuffer))

const s3 = new S3Client({
  endpoint: process.env.FAKE_S3_ENDPOINT ?? 'http://127.0.0.1:4578',
  region: 'us-east-1',
  forcePathStyle: true,
  credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
  requestChecksumCalculation: 'WHEN_REQUIRED',
  responseChecksumValidation: 'WHEN_REQUIRED',
})

async function fetchAs(client: Client, path: string) {
  const headers: Record<string, string> = {}
  if (client.cookies.size) headers.cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  return fetch(new URL(path, BASE_URL), { headers })
}

async function bracketMatches(): Promise<(MatchView & { bracketKey: string })[]> {
  const res = await organizer.get(`${f.base}/bracket`)
  expect(res.status).toBe(200)
  return res.data.matches
}

/** A pool of four, X > Y > Z > W with one double, then a bracket with a bronze match, fenced to the end. */
async function finishedTournament(): Promise<Fixture> {
  const fixture = await makeFixture(club, organizer, { fighters: FOUR, poolSize: 4, qualifyCount: 4, bronzeMatch: true })
  const pools = await drawPools(fixture)
  for (const [i, a] of RANKED.entries()) {
    for (const b of RANKED.slice(i + 1)) {
      const match = matchBetween(pools, a, b)
      if (i === 0 && b === RANKED[1]) {
        const side = sideOf(match, a)
        const res = await record(organizer, fixture.base, match.id, [clean(side), double(), clean(side)])
        expect(res.status, JSON.stringify(res.data)).toBe(201)
      }
      else {
        await fenceMatch(fixture, match, a, 3)
      }
    }
  }
  expect((await organizer.post(`${fixture.base}/phase`, { to: 'finals' })).status).toBe(200)
  f = fixture
  // Semifinals, then the bronze match and the final: the better seed wins each.
  for (const round of [['r1m1', 'r1m2'], ['bronze', 'r2m1']]) {
    const matches = await bracketMatches()
    for (const key of round) {
      const match = matches.find(m => m.bracketKey === key)!
      const better = RANKED.find(name => name === match.sideA?.name || name === match.sideB?.name)!
      await fenceMatch(fixture, match, better, 3)
    }
  }
  expect((await organizer.post(`/api/clubs/${club.id}/events/${fixture.eventId}/publish`)).status).toBe(200)
  return fixture
}

beforeAll(async () => {
  club = await makeClub('cards')
  organizer = await as(club, 'organizer')
  editor = await as(club, 'editor')
  f = await finishedTournament()
}, 120_000)

afterAll(async () => {
  await pool.end()
})

async function subjects() {
  const res = await editor.get(`${cards()}/tournaments/${f.tournamentId}`)
  expect(res.status, JSON.stringify(res.data)).toBe(200)
  return res.data as { subjects: { subject: string, id: number, label: string, kinds: string[] }[], cardsPerSize: number }
}

describe('the card studio', () => {
  it('lists the tournament with what its cards can be about: finished matches, fighters, the pool and the tournament', async () => {
    const studio = await editor.get(cards())
    expect(studio.status).toBe(200)
    expect(studio.data.tournaments.map((t: { id: number }) => t.id)).toContain(f.tournamentId)
    expect(studio.data.brand.notice).toBeNull()
    const { subjects: list, cardsPerSize } = await subjects()
    const count = (s: string) => list.filter(x => x.subject === s).length
    // Six pool matches and four final matches (two semifinals, bronze, final).
    expect([count('match'), count('fighter'), count('pool'), count('tournament')]).toEqual([10, 4, 1, 1])
    expect(list.find(x => x.subject === 'tournament')!.kinds).toEqual(['podium', 'summary'])
    expect(cardsPerSize).toBe(17)
    expect(list.map(x => x.label)).toContain('Final: Hedda Crane v Alder Mossley, 6–0')
  })

  it('draws a card once, stores it under its hash in object storage, and finds it there the next time', async () => {
    const { subjects: list } = await subjects()
    const match = list.find(s => s.label.startsWith('Pool 1') && s.label.includes('Hedda Crane') && s.label.includes('Alder Mossley'))!
    const body = { tournamentId: f.tournamentId, kind: 'match', subjectId: match.id, size: 'square' }
    const first = await editor.post(cards(), body)
    expect(first.status, JSON.stringify(first.data)).toBe(200)
    expect(first.data.cached).toBe(false)
    expect(first.headers.get('x-card-cache')).toBe('miss')
    const key = `cards/${club.id}/${first.data.hash}.png`
    const stored = await s3.send(new HeadObjectCommand({ Bucket: 'unscathed', Key: key }))

    const again = await editor.post(cards(), body)
    expect(again.data).toMatchObject({ hash: first.data.hash, cached: true })
    const still = await s3.send(new HeadObjectCommand({ Bucket: 'unscathed', Key: key }))
    expect(still.LastModified).toEqual(stored.LastModified)

    const png = await fetchAs(editor, first.data.url)
    expect(png.status).toBe(200)
    expect(png.headers.get('content-type')).toBe('image/png')
    const image = decode(await png.arrayBuffer())
    expect([image.width, image.height]).toEqual([1080, 1080])
    // The alt text is written from the match: both fighters, the score and the double.
    expect(first.data.alt).toContain('Hedda Crane (Ironquay Fencing Hall)')
    // Two clean torso cuts at 2 points; the double scores nothing under this rule set.
    expect(first.data.alt).toMatch(/4 to 0|0 to 4/)
    expect(first.data.alt).toContain('double')
  })

  it('draws every size at its exact dimensions', async () => {
    for (const size of CARD_SIZE_NAMES) {
      const res = await editor.post(cards(), { tournamentId: f.tournamentId, kind: 'podium', size })
      expect(res.status, JSON.stringify(res.data)).toBe(200)
      const image = decode(await (await fetchAs(editor, res.data.url)).arrayBuffer())
      expect([image.width, image.height], size).toEqual([CARD_SIZES[size].width, CARD_SIZES[size].height])
    }
  })

  it('makes a new card for an edited headline, and puts the headline in the alt text', async () => {
    const base = { tournamentId: f.tournamentId, kind: 'summary', size: 'link' }
    const plain = await editor.post(cards(), base)
    const edited = await editor.post(cards(), { ...base, headline: 'Four fighters, one champion', caption: '' })
    expect(edited.status).toBe(200)
    expect(edited.data.hash).not.toBe(plain.data.hash)
    expect(edited.data.headline).toBe('Four fighters, one champion')
    expect(edited.data.caption).toBe('')
    expect(edited.data.defaults.headline).toBe(plain.data.headline)
    expect(edited.data.alt).toContain('“Four fighters, one champion”')
    expect(edited.data.alt).toContain('Winner: Hedda Crane')
  })

  it('lets only the club’s editors make or see its cards', async () => {
    const body = { tournamentId: f.tournamentId, kind: 'summary', size: 'square' }
    const made = await editor.post(cards(), body)
    expect((await new Client().post(cards(), body)).status).toBe(401)
    expect((await organizer.post(cards(), body)).status).toBe(403)
    const other = await makeClub('cards-other')
    const stranger = await as(other, 'editor')
    expect((await stranger.post(cards(), body)).status).toBe(404)
    expect((await stranger.post(`/api/clubs/${other.id}/cards`, body)).status).toBe(404)
    expect((await fetchAs(new Client(), made.data.url)).status).toBe(401)
    expect((await fetchAs(stranger, made.data.url)).status).toBe(404)
    expect((await fetchAs(organizer, made.data.url)).status).toBe(403)
  })

  it('answers bad requests with a message naming the field, and changes nothing', async () => {
    const before = await tableCounts()
    const missing = await editor.post(cards(), { tournamentId: f.tournamentId, kind: 'fighter', size: 'square' })
    expect(missing.status).toBe(400)
    expect(missing.data.data.fields).toHaveProperty('subjectId')
    const size = await editor.post(cards(), { tournamentId: f.tournamentId, kind: 'summary', size: 'poster' })
    expect(size.status).toBe(400)
    expect(size.data.message).toMatch(/^size:/)
    const long = await editor.post(cards(), { tournamentId: f.tournamentId, kind: 'summary', size: 'square', headline: 'x'.repeat(81) })
    expect(long.data.data.fields).toHaveProperty('headline')
    expect((await editor.post(cards(), { tournamentId: 999999, kind: 'summary', size: 'square' })).status).toBe(404)
    expect((await editor.post(cards(), { tournamentId: f.tournamentId, kind: 'match', subjectId: 999999, size: 'square' })).status).toBe(404)
    expect((await editor.request('POST', cards(), { body: 'not json', headers: { 'content-type': 'application/json' } })).status).toBe(400)
    expect((await editor.post(`${cards()}/batches`, { tournamentId: f.tournamentId, sizes: ['square', 'square'] })).status).toBe(400)
    expect(await tableCounts()).toEqual(before)
  })

  it('refuses cards that have nothing to show yet: a match not fenced, a tournament taking entries, a podium before the finals', async () => {
    const open = await makeFixture(club, organizer, { fighters: FOUR, poolSize: 4 })
    const pools = await drawPools(open)
    const unfought = matchBetween(pools, RANKED[0]!, RANKED[1]!)
    const match = await editor.post(cards(), { tournamentId: open.tournamentId, kind: 'match', subjectId: unfought.id, size: 'square' })
    expect(match.status).toBe(409)
    expect(match.data.message).toMatch(/no result yet/)
    const podium = await editor.post(cards(), { tournamentId: open.tournamentId, kind: 'podium', size: 'square' })
    expect(podium.status).toBe(409)
    expect(podium.data.message).toMatch(/finals have not started/)
    const entries = await makeFixture(club, organizer, { fighters: FOUR, startPools: false })
    const early = await editor.post(cards(), { tournamentId: entries.tournamentId, kind: 'summary', size: 'square' })
    expect(early.status).toBe(409)
    expect(early.data.data.fields).toHaveProperty('tournamentId')
  })
})

interface Batch { id: number, status: string, total: number, done: number, reused: number, error: string | null, downloadUrl: string | null }

async function waitForBatch(client: Client, id: number, seen: number[] = [], base = BASE_URL): Promise<Batch> {
  const until = Date.now() + 90_000
  for (;;) {
    const res = await fetch(new URL(`${cards()}/batches/${id}`, base), { headers: { cookie: [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } })
    expect(res.status).toBe(200)
    const { batch } = await res.json() as { batch: Batch }
    seen.push(batch.done)
    if (batch.status === 'done' || batch.status === 'failed') return batch
    if (Date.now() > until) throw new Error(`batch ${id} still ${batch.status} after 90 s`)
    await new Promise(r => setTimeout(r, 150))
  }
}

describe('batch export', () => {
  it('exports every card of the tournament in the chosen sizes as one ZIP, with its progress along the way', async () => {
    const sizes: CardSize[] = ['link', 'portrait']
    const start = await editor.post(`${cards()}/batches`, { tournamentId: f.tournamentId, sizes })
    expect(start.status, JSON.stringify(start.data)).toBe(202)
    expect(start.data.batch).toMatchObject({ status: 'queued', done: 0 })
    const seen: number[] = []
    const batch = await waitForBatch(editor, start.data.batch.id, seen)
    expect(batch.status, batch.error ?? '').toBe('done')
    expect(batch.total).toBe(17 * sizes.length)
    expect(batch.done).toBe(batch.total)
    // The progress only moves forward.
    expect(seen).toEqual([...seen].sort((a, b) => a - b))

    const res = await fetchAs(editor, batch.downloadUrl!)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="sword-and-buckler-cards\.zip"/)
    const files = readZip(Buffer.from(await res.arrayBuffer()))

    const { subjects: list } = await subjects()
    const slug = (s: string) => s.normalize('NFKD').replace(/[\u0300-\u036F]/g, '').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '')
    const expected = sizes.flatMap(size => list.flatMap(s => s.kinds.map((kind) => {
      const name = s.subject === 'match' ? s.label.replace(/, [^,]*$/, '').replace(':', '') : s.subject === 'fighter' ? s.label.replace(/ \(.*\)$/, '') : s.label
      return `sword-and-buckler/${size}/${kind}-${slug(name)}.png`
    })))
    expect([...files.keys()].sort()).toEqual([...expected, 'sword-and-buckler/alt-text.csv'].sort())
    for (const [name, data] of files) {
      if (!name.endsWith('.png')) continue
      const size = name.split('/')[1] as CardSize
      const image = decode(data)
      expect([image.width, image.height], name).toEqual([CARD_SIZES[size].width, CARD_SIZES[size].height])
    }
    const csv = files.get('sword-and-buckler/alt-text.csv')!.toString('utf8').trim().split('\r\n')
    expect(csv[0]).toBe('"file","headline","caption","alt text"')
    expect(csv).toHaveLength(expected.length + 1)
    expect(csv.some(line => line.includes('Winner: Hedda Crane (Ironquay Fencing Hall)'))).toBe(true)
  })

  it('reuses every card already in the store when the same batch runs again', async () => {
    const start = await editor.post(`${cards()}/batches`, { tournamentId: f.tournamentId, sizes: ['link'] })
    const first = await waitForBatch(editor, start.data.batch.id)
    const again = await waitForBatch(editor, (await editor.post(`${cards()}/batches`, { tournamentId: f.tournamentId, sizes: ['link'] })).data.batch.id)
    expect(first.status).toBe('done')
    expect(again).toMatchObject({ status: 'done', total: 17, reused: 17 })
  })

  it('runs jobs in worker processes only, and runs each once when several workers take them', async () => {
    let web: SecondApp | undefined
    let worker: SecondApp | undefined
    try {
      ;[web, worker] = await Promise.all([startSecondApp({ UNSCATHED_ROLE: 'web' }), startSecondApp({ UNSCATHED_ROLE: 'worker' })])
      // Signed in on the web process itself, which seals its own sessions.
      const signIn = await fetch(new URL('/api/auth/sign-in', web.url), {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email: club.members.editor.email, password: PASSWORD }),
      })
      expect(signIn.status).toBe(200)
      const session = new Client()
      for (const line of signIn.headers.getSetCookie()) {
        const [pair] = line.split(';')
        const at = pair!.indexOf('=')
        session.cookies.set(pair!.slice(0, at), pair!.slice(at + 1))
      }
      const post = async (body: unknown) => {
        const res = await fetch(new URL(`${cards()}/batches`, web!.url), {
          method: 'POST',
          headers: { 'content-type': 'application/json', 'cookie': [...session.cookies].map(([k, v]) => `${k}=${v}`).join('; ') },
          body: JSON.stringify(body),
        })
        expect(res.status).toBe(202)
        return res.json() as Promise<{ batch: Batch }>
      }
      const started = await Promise.all(['square', 'story', 'link', 'portrait'].map(size => post({ tournamentId: f.tournamentId, sizes: [size] })))
      const done = await Promise.all(started.map(s => waitForBatch(session, s.batch.id, [], web!.url)))
      expect(done.map(b => b.status)).toEqual(['done', 'done', 'done', 'done'])

      const ids = started.map(s => s.batch.id)
      const rows = await db.select().from(schema.cardBatches)
      const ours = rows.filter(r => ids.includes(r.id))
      // The web process put the jobs on the queue but took none of them.
      expect(ours.map(r => r.worker)).not.toContain(`${hostname()}:${web.process.pid}`)
      expect(ours.every(r => r.worker !== null)).toBe(true)
      // The queue marks a job completed just after its handler returns, a moment after the batch is done.
      const jobs = async () => (await pool.query<{ state: string, retry_count: number }>(
        `select state, retry_count from pgboss.job where name = 'cards-batch' and (data->>'batchId')::int = any($1)`, [ids])).rows
      await expect.poll(async () => (await jobs()).map(j => j.state), { timeout: 10_000 }).toEqual(['completed', 'completed', 'completed', 'completed'])
      expect((await jobs()).map(j => j.retry_count)).toEqual([0, 0, 0, 0])
    }
    finally {
      await Promise.all([web?.stop(), worker?.stop()])
    }
  }, 120_000)
})

describe('public pages and their link previews', () => {
  const site = () => `/site/${club.slug}`

  function ogTags(html: string) {
    const tags = new Map<string, string>()
    for (const m of html.matchAll(/<meta[^>]+property="(og:[a-z:_]+)"[^>]+content="([^"]*)"/g)) tags.set(m[1]!, m[2]!.replace(/&amp;/g, '&'))
    for (const m of html.matchAll(/<meta[^>]+content="([^"]*)"[^>]+property="(og:[a-z:_]+)"/g)) tags.set(m[2]!, m[1]!.replace(/&amp;/g, '&'))
    return tags
  }

  async function checkPage(path: string, title: RegExp) {
    const res = await fetch(new URL(path, BASE_URL))
    expect(res.status, path).toBe(200)
    const html = await res.text()
    const tags = ogTags(html)
    // The four properties ogp.me requires of every page.
    for (const property of ['og:title', 'og:type', 'og:image', 'og:url']) expect(tags.get(property), `${path} ${property}`).toBeTruthy()
    expect(tags.get('og:title')).toMatch(title)
    expect(tags.get('og:url')).toBe(new URL(path, BASE_URL).toString())
    const image = await fetch(tags.get('og:image')!)
    expect(image.status).toBe(200)
    expect(image.headers.get('content-type')).toBe('image/png')
    const png = decode(await image.arrayBuffer())
    // 1200×630, the size the largest platform recommends for link previews (ogp.me examples).
    expect([png.width, png.height]).toEqual([1200, 630])
    return html
  }

  it('gives the event page the Open Graph tags, with its summary card as the image', async () => {
    await checkPage(`${site()}/events/${f.eventSlug}`, /Wrenmouth Harvest Open/)
  })

  it('has a public match page, readable without scripts, with fighters, clubs, the bouts and the score', async () => {
    const final = (await bracketMatches()).find(m => m.bracketKey === 'r2m1')!
    const html = await checkPage(`${site()}/matches/${final.id}`, /Hedda Crane v Alder Mossley/)
    expect(html).toContain('Ironquay Fencing Hall')
    expect(html).toContain('North Downs Buckler Circle')
    expect(html).toMatch(/Score 6 to 0|6–0/)
    expect(html).toContain('Clean hit by Hedda Crane')
    expect(html).toMatch(/Safety on the day/)
    expect(html).toContain(`${site()}/fighters/`)
  })

  it('has a public fighter page with their results in the club’s published events', async () => {
    const api = await new Client().get(`/api/public/matches/${club.slug}/${(await bracketMatches())[0]!.id}`)
    const fighterId = api.data.match.a.fighterId as number
    const html = await checkPage(`${site()}/fighters/${fighterId}`, new RegExp(api.data.match.a.name))
    expect(html).toContain('Survival rate')
    expect(html).toContain('Sword and buckler')
    expect(html).toMatch(/Safety on the day/)
  })

  it('shows nothing of unpublished events: no match page, no fighter page, no card', async () => {
    // Fighters who fence in no published event.
    const unseen = [
      { name: 'Dorrit Vane', clubName: 'Old Mill Fencing School' },
      { name: 'Esk Farrow', clubName: 'Saltmarsh Sword Guild' },
      { name: 'Fenna Rook', clubName: 'Ironquay Fencing Hall' },
    ]
    const hidden = await makeFixture(club, organizer, { fighters: unseen, poolSize: 3 })
    const pools = await drawPools(hidden)
    const match = pools[0]!.matches[0]!
    await fenceMatch(hidden, match, match.sideA!.name, 3)
    const anyone = new Client()
    expect((await anyone.get(`/api/public/matches/${club.slug}/${match.id}`)).status).toBe(404)
    expect((await anyone.get(`/api/public/fighters/${club.slug}/${match.sideA!.fighterId}`)).status).toBe(404)
    expect((await fetch(new URL(`/cards/og/${club.slug}/match/${match.id}.png`, BASE_URL))).status).toBe(404)
    expect((await fetch(new URL(`/cards/og/${club.slug}/event/${hidden.eventSlug}.png`, BASE_URL))).status).toBe(404)
    expect((await fetch(new URL(`${site()}/matches/${match.id}`, BASE_URL))).status).toBe(404)
    // Another club's slug does not reach this club's match either.
    expect((await anyone.get(`/api/public/matches/saltmarsh-sword-guild/${(await bracketMatches())[0]!.id}`)).status).toBe(404)
    expect((await anyone.get(`/api/public/matches/${club.slug}/not-a-number`)).status).toBe(400)
  })
})
