import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { LiveMessage, RingLive } from '../../shared/live/types'
import type { SecondApp } from '../support/app'
import { startSecondApp } from '../support/app'
import type { TestClub } from '../support/fixtures'
import { makeClub, pool, tableCounts } from '../support/fixtures'
import { BASE_URL, Client } from '../support/http'
import type { SseClient } from '../support/sse'
import { openStream } from '../support/sse'
import type { Fixture, MatchView, PoolView } from '../support/tournament'
import { ROSTER, as, clean, drawPools, makeFixture, makeRuleSet, record } from '../support/tournament'

let club: TestClub
let organizer: Client
const streams: SseClient[] = []
const apps: SecondApp[] = []

interface Ring { ring: number, version: number, currentMatchId: number | null, overlay: { path: string } | null }

async function rings(f: Fixture, client: Client = organizer): Promise<Ring[]> {
  const res = await client.get(`/api/clubs/${club.id}/events/${f.eventId}/rings`)
  expect(res.status).toBe(200)
  return res.data.rings
}

/** The overlay token of a ring. */
async function tokenOf(f: Fixture, ring: number) {
  return (await rings(f)).find(r => r.ring === ring)!.overlay!.path.split('/').pop()!
}

async function follow(url: string, options: Parameters<typeof openStream>[1] = {}) {
  const stream = await openStream(url, options)
  streams.push(stream)
  return stream
}

const parsed = (stream: SseClient) => stream.json<LiveMessage>()
const seqs = (stream: SseClient) => parsed(stream).map(m => m.seq)
const matchMessages = (stream: SseClient) => parsed(stream).filter((m): m is Extract<LiveMessage, { kind: 'match' }> => m.kind === 'match')

/** A tournament of five in one ring, pools drawn: the first pool match and its ring's overlay token. */
async function ringWithMatch(options: { ruleSetId?: number } = {}) {
  const f = await makeFixture(club, organizer, { rings: 1, poolSize: 5, ...options })
  const pools: PoolView[] = await drawPools(f)
  const match = pools[0]!.matches[0]!
  return { f, pools, match, token: await tokenOf(f, pools[0]!.ringNumber) }
}

beforeAll(async () => {
  club = await makeClub('live')
  organizer = await as(club, 'organizer')
})
afterAll(async () => {
  for (const s of streams) s.close()
  for (const app of apps) await app.stop()
  await pool.end()
})

describe('the overlay stream', () => {
  it('starts with the ring\'s snapshot, then carries each bout the desk records, in order', async () => {
    const { f, pools, match, token } = await ringWithMatch()
    const stream = await follow(`${BASE_URL}/live/overlay/${token}`)
    expect(stream.status).toBe(200)
    const [first] = await stream.until(m => m.length >= 1, 5000, 'the first snapshot')
    expect(first!.event).toBe('ring')
    // The stored snapshot may predate the draw on a busy machine; the one made after it follows.
    type RingMessage = Extract<LiveMessage, { kind: 'ring' }>
    const rings = () => parsed(stream).filter((m): m is RingMessage => m.kind === 'ring')
    await stream.until(() => rings().some(r => r.snapshot.onDeck), 5000, 'a snapshot with the match on deck')
    const snapshot = rings().find(r => r.snapshot.onDeck)!.snapshot
    expect(snapshot).toMatchObject({ eventId: f.eventId, ring: 1, match: null, board: { mode: 'auto' } })
    expect(snapshot.onDeck?.id).toBe(match.id)
    expect(snapshot.pool?.rows.map(r => r.name).sort()).toEqual(pools[0]!.fighters.map(p => p.name).sort())

    const sent = performance.now()
    expect((await record(organizer, f.base, match.id, [clean('a', 'head')])).status).toBe(201)
    await stream.until(() => matchMessages(stream).length >= 1, 1000, 'the bout within a second')
    const bout = matchMessages(stream)[0]!
    expect(stream.messages.find(m => m.event === 'match')!.at - sent).toBeLessThan(1000)
    expect(bout.match).toMatchObject({ id: match.id, version: 1, status: 'under-way', bouts: [{ n: 1, hit: { a: false, b: true }, kind: 'clean', by: 'a' }] })
    expect(bout.match.score.a).toBeGreaterThan(0)

    // A fresh snapshot follows with the match on the ring; numbers only ever go up by one.
    await stream.until(() => rings().some(r => r.snapshot.match?.id === match.id), 5000, 'the next snapshot')
    expect(rings().at(-1)!.snapshot.match?.id).toBe(match.id)
    const numbers = seqs(stream)
    expect(numbers).toEqual(numbers.map((_, i) => numbers[0]! + i))
    expect(stream.messages.map(m => m.id)).toEqual(numbers.map(String))
  })

  it('resumes from Last-Event-ID with nothing missed and nothing repeated', async () => {
    const { f, match, token } = await ringWithMatch()
    const url = `${BASE_URL}/live/overlay/${token}`
    const first = await follow(url)
    await first.until(m => m.length >= 1)
    await record(organizer, f.base, match.id, [clean('a')])
    await record(organizer, f.base, match.id, [clean('b')])
    await first.until(() => matchMessages(first).length >= 2)
    first.close()
    const lastId = first.lastId!
    await record(organizer, f.base, match.id, [clean('a')])
    const after = await follow(url, { lastEventId: lastId })
    await after.until(() => matchMessages(after).some(m => m.match.version === 3), 5000, 'the bout recorded while away')
    const resumed = seqs(after)
    expect(resumed[0]).toBe(Number(lastId) + 1)
    expect(resumed).toEqual(resumed.map((_, i) => resumed[0]! + i))
    // Every match state came once, in version order, across both connections.
    const versions = [...matchMessages(first), ...matchMessages(after)].map(m => m.match.version)
    expect(versions).toEqual([1, 2, 3])
  })

  it('follows every ring of the event for members, resuming each ring where it was', async () => {
    const f = await makeFixture(club, organizer, { rings: 2, poolSize: 3, fighters: ROSTER.slice(0, 6) })
    const pools: PoolView[] = await drawPools(f)
    expect(pools.map(p => p.ringNumber).sort()).toEqual([1, 2])
    const table = await as(club, 'scorekeeper')
    const cookie = [...table.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    const url = `${BASE_URL}/live/clubs/${club.id}/events/${f.eventId}`
    expect((await follow(url)).status).toBe(401)
    const stream = await follow(url, { headers: { cookie } })
    await stream.until(m => m.filter(x => x.event === 'ring').length >= 2, 5000, 'a snapshot of each ring')
    const [one, two] = [pools.find(p => p.ringNumber === 1)!, pools.find(p => p.ringNumber === 2)!]
    await record(table, f.base, one.matches[0]!.id, [clean('a')])
    await stream.until(() => matchMessages(stream).length >= 1)
    stream.close()
    const id = stream.lastId!
    expect(id).toMatch(/^1:\d+,2:\d+$/)
    await record(table, f.base, two.matches[0]!.id, [clean('b')])
    const again = await follow(url, { headers: { cookie }, lastEventId: id })
    await again.until(() => matchMessages(again).length >= 1, 5000, 'ring 2\'s bout')
    expect(matchMessages(again).map(m => [m.ring, m.match.id])).toEqual([[2, two.matches[0]!.id]])
    expect(again.messages.every(m => /^1:\d+,2:\d+$/.test(m.id!))).toBe(true)
  })
})

describe('the rings\' snapshots', () => {
  it('keep a ring marked when a change lands while its snapshot is being made, so that another snapshot follows', async () => {
    const { f, match } = await ringWithMatch()
    // A snapshot in the making: the lock the hub holds while it makes ring 1's snapshot (LIVE_LOCK_SPACE
    // in server/utils/liveHub.ts), and the mark it read, which it clears once its snapshot is out.
    const maker = await pool.connect()
    const markedLater = async (than: string) => {
      const { rows } = await pool.query<{ later: boolean }>('select marked_at > $2::timestamptz as later from live_dirty where event_id = $1 and ring_number = 1', [f.eventId, than])
      return rows[0]?.later ?? false
    }
    try {
      await maker.query('begin')
      await maker.query('select pg_advisory_xact_lock($1, $2)', [7301, f.eventId * 16 + 1])
      const { rows: [read] } = await pool.query<{ at: string }>(`insert into live_dirty (event_id, ring_number, marked_at) values ($1, 1, now() - interval '1 hour')
        on conflict (event_id, ring_number) do update set marked_at = excluded.marked_at returning marked_at::text as at`, [f.eventId])

      // A bout (the desk's one statement) and a call (a change without a message) both move the mark on.
      expect((await record(organizer, f.base, match.id, [clean('a')])).status).toBe(201)
      expect(await markedLater(read!.at)).toBe(true)
      const { rows: [again] } = await pool.query<{ at: string }>('select marked_at::text as at from live_dirty where event_id = $1 and ring_number = 1', [f.eventId])
      const ring = (await rings(f))[0]!
      expect((await organizer.post(`/api/clubs/${club.id}/events/${f.eventId}/rings/1/call`, { matchId: match.id, expectedVersion: ring.version })).status).toBe(200)
      expect(await markedLater(again!.at)).toBe(true)
    }
    finally {
      await maker.query('rollback')
      maker.release()
    }
  })

  it('reads a ring again when a change lands while its snapshot is being made, so a snapshot is never older than its number', async () => {
    const { f } = await ringWithMatch()
    const snapshots = async () => (await pool.query<{ seq: number, onAir: string }>(
      `select seq, payload->'snapshot'->'board'->>'onAir' as "onAir" from live_events
       where event_id = $1 and ring_number = 1 and kind = 'ring' order by seq`, [f.eventId])).rows
    await expect.poll(async () => (await snapshots()).length, { timeout: 5000 }).toBeGreaterThan(0)

    // A desk holds the ring's row, as the board route does, while a snapshot is asked for.
    const desk = await pool.connect()
    let changedTo = 0
    try {
      await desk.query('begin')
      const pid = (await desk.query<{ pid: number }>('select pg_backend_pid() as pid')).rows[0]!.pid
      await desk.query('select seq from ring_states where event_id = $1 and ring_number = 1 for update', [f.eventId])
      await pool.query(`insert into live_dirty (event_id, ring_number) values ($1, 1)
        on conflict (event_id, ring_number) do update set marked_at = clock_timestamp()`, [f.eventId])
      await pool.query('select pg_notify($1, $2)', ['unscathed_live_dirty', `${f.eventId}:1`])
      // The snapshot has read the ring and waits for its row.
      await expect.poll(async () => (await pool.query<{ n: number }>('select count(*)::int as n from pg_stat_activity where $1 = any(pg_blocking_pids(pid))', [pid])).rows[0]!.n,
        { timeout: 5000 }).toBe(1)
      // The board route's change, committed while the snapshot waits: another board and the ring's next number.
      const { rows: [changed] } = await desk.query<{ seq: number }>(`update ring_states set board = 'pool', board_mode = 'manual', seq = seq + 1
        where event_id = $1 and ring_number = 1 returning seq`, [f.eventId])
      changedTo = changed!.seq
      await desk.query('commit')
    }
    catch (err) {
      await desk.query('rollback')
      throw err
    }
    finally {
      desk.release()
    }
    await expect.poll(async () => (await snapshots()).filter(s => s.seq > changedTo).length, { timeout: 5000 }).toBeGreaterThan(0)
    expect([...new Set((await snapshots()).filter(s => s.seq > changedTo).map(s => s.onAir))]).toEqual(['pool'])
  })
})

describe('two app processes', () => {
  it('push the same bout to their clients through PostgreSQL, with heartbeats on idle streams', async () => {
    const second = await startSecondApp({ UNSCATHED_LIVE_HEARTBEAT_MS: '200' })
    apps.push(second)
    const { f, match, token } = await ringWithMatch()
    const here = await follow(`${BASE_URL}/live/overlay/${token}`)
    const there = await follow(`${second.url}/live/overlay/${token}`)
    await Promise.all([here.until(m => m.length >= 1), there.until(m => m.length >= 1)])
    await new Promise(resolve => setTimeout(resolve, 700))
    expect(there.comments).toBeGreaterThanOrEqual(2)
    expect((await record(organizer, f.base, match.id, [clean('b', 'arms')])).status).toBe(201)
    await Promise.all([here.until(() => matchMessages(here).length >= 1), there.until(() => matchMessages(there).length >= 1)])
    expect(matchMessages(there)[0]).toEqual(matchMessages(here)[0])
    expect(there.messages.find(m => m.event === 'match')!.id).toBe(here.messages.find(m => m.event === 'match')!.id)
  })

  it('drop a client too slow to read, never the others or the server', async () => {
    const second = await startSecondApp({ UNSCATHED_LIVE_MAX_BUFFER: String(256 * 1024), UNSCATHED_LIVE_SLOW_MS: '1000' })
    apps.push(second)
    const { f, token } = await ringWithMatch()
    const slow = await follow(`${second.url}/live/overlay/${token}`)
    const steady = await follow(`${second.url}/live/overlay/${token}`)
    await Promise.all([slow.until(m => m.length >= 1), steady.until(m => m.length >= 1)])
    slow.pause()
    // Volume no real ring makes: messages of 100 kB each, written to the bus the way publishLive
    // writes them (numbered under the ring's row, stored, NOTIFY without the body).
    const padding = 'x'.repeat(100_000)
    const count = 120
    for (let i = 0; i < count; i++) {
      await pool.query(`with r as (update ring_states set seq = seq + 1 where event_id = $1 and ring_number = 1 returning seq),
        e as (insert into live_events (event_id, ring_number, seq, kind, payload)
          select $1, 1, r.seq, 'board', jsonb_build_object('kind', 'board', 'ring', 1, 'seq', r.seq, 'at', now(), 'board', jsonb_build_object('onAir', 'bout', 'mode', 'auto'), 'padding', $2::text) from r returning seq)
        select pg_notify('unscathed_live', $1 || ':1:' || e.seq || ':board') from e`, [f.eventId, padding])
    }
    await steady.until(m => m.filter(x => x.event === 'board').length >= count, 20_000, 'every large message')
    // The slow client has now been behind by more than the limit for longer than a second.
    await new Promise(resolve => setTimeout(resolve, 2500))
    slow.resume()
    await slow.untilClosed(10_000)
    expect(slow.messages.filter(m => m.event === 'board').length).toBeLessThan(count)
    expect((await fetch(second.url)).status).toBe(200)
    const numbers = seqs(steady)
    expect(numbers).toEqual(numbers.map((_, i) => numbers[0]! + i))
  })
})

describe('overlay tokens', () => {
  it('open the ring read-only; a rotated token is refused at once and its streams close', async () => {
    const { f, token } = await ringWithMatch()
    const anon = new Client()
    const snapshot = await anon.get(`/api/overlay/${token}`)
    expect(snapshot.status).toBe(200)
    expect((snapshot.data as RingLive).eventId).toBe(f.eventId)
    const open = await follow(`${BASE_URL}/live/overlay/${token}`)
    await open.until(m => m.length >= 1)

    // Only those who run the stream see and rotate the address.
    const table = await as(club, 'scorekeeper')
    expect((await rings(f, table))[0]!.overlay).toBeNull()
    expect((await table.post(`/api/clubs/${club.id}/events/${f.eventId}/rings/1/token`)).status).toBe(403)
    const streamer = await as(club, 'streamer')
    const rotated = await streamer.post(`/api/clubs/${club.id}/events/${f.eventId}/rings/1/token`)
    expect(rotated.status).toBe(200)
    const fresh = rotated.data.overlay.path.split('/').pop()
    expect(fresh).toMatch(/^[0-9a-f]{64}$/)
    expect(fresh).not.toBe(token)

    await open.untilClosed(3000)
    const refused = await anon.get(`/api/overlay/${token}`)
    expect(refused.status).toBe(404)
    expect(refused.data.message).toContain('not valid any more')
    expect((await follow(`${BASE_URL}/live/overlay/${token}`)).status).toBe(404)
    expect((await anon.get(`/api/overlay/${fresh}`)).status).toBe(200)
    expect((await anon.get('/api/overlay/not-a-token')).status).toBe(400)
  })

  it('are accepted by no write route, in any place a token could be sent', async () => {
    const { f, match, token } = await ringWithMatch()
    const before = await tableCounts()
    const body = { expectedVersion: 0, entries: [clean('a')] }
    const paths = [
      `${f.base}/matches/${match.id}/entries?token=${token}`,
      `/api/clubs/${club.id}/events/${f.eventId}/rings/1/board?token=${token}`,
      `/api/clubs/${club.id}/events/${f.eventId}/rings/1/call?token=${token}`,
      `/api/overlay/${token}`,
    ]
    for (const path of paths) {
      const variants: Record<string, string>[] = [{}, { authorization: `Bearer ${token}` }, { 'x-overlay-token': token }]
      for (const headers of variants) {
        const res = await new Client().request('POST', path, { json: body, headers })
        expect([401, 404, 405], `${path} ${JSON.stringify(headers)}`).toContain(res.status)
      }
    }
    expect(await tableCounts()).toEqual(before)
  })
})

describe('the ring\'s controls', () => {
  it('calls a match to the ring with a version check, and refuses a match of another ring', async () => {
    const f = await makeFixture(club, organizer, { rings: 2, poolSize: 3, fighters: ROSTER.slice(0, 6) })
    const pools: PoolView[] = await drawPools(f)
    const table = await as(club, 'scorekeeper')
    const ringOne = pools.find(p => p.ringNumber === 1)!
    const ringTwo = pools.find(p => p.ringNumber === 2)!
    const call = (matchId: number | null, expectedVersion: number, ring = 1) =>
      table.post(`/api/clubs/${club.id}/events/${f.eventId}/rings/${ring}/call`, { matchId, expectedVersion })
    const called = await call(ringOne.matches[1]!.id, 0)
    expect(called.status).toBe(200)
    expect((called.data as RingLive).match?.id).toBe(ringOne.matches[1]!.id)
    const stale = await call(ringOne.matches[0]!.id, 0)
    expect(stale.status).toBe(409)
    expect(stale.data.data.fields.expectedVersion).toBe('The ring is at version 1')
    expect(stale.data.data.ring.match.id).toBe(ringOne.matches[1]!.id)
    const elsewhere = await call(ringTwo.matches[0]!.id, 1)
    expect(elsewhere.status).toBe(409)
    expect(elsewhere.data.data.fields.matchId).toBe('This match is fenced in ring 2')
    expect((await call(999999999, 1)).data.data.fields.matchId).toContain('No match')
    expect((await table.post(`/api/clubs/${club.id}/events/${f.eventId}/rings/9/call`, { matchId: null, expectedVersion: 1 })).data.data.fields.ring).toContain('at most')
    expect((await table.post(`/api/clubs/${club.id}/events/${f.eventId}/rings/2/call`, { matchId: 'x', expectedVersion: 0 })).data.data.fields.matchId).toBeDefined()
    expect((await call(null, 1)).status).toBe(200)
    expect((await (await as(club, 'streamer')).post(`/api/clubs/${club.id}/events/${f.eventId}/rings/1/call`, { matchId: null, expectedVersion: 2 })).status).toBe(403)
  })

  it('puts a board on air for the streamer and sends it on the ring\'s stream', async () => {
    const { f, token } = await ringWithMatch()
    const stream = await follow(`${BASE_URL}/live/overlay/${token}`)
    await stream.until(m => m.length >= 1)
    const streamer = await as(club, 'streamer')
    const res = await streamer.post(`/api/clubs/${club.id}/events/${f.eventId}/rings/1/board`, { onAir: 'pool' })
    expect(res.status).toBe(200)
    expect(res.data.board).toEqual({ onAir: 'pool', mode: 'manual' })
    await stream.until(m => m.some(x => x.event === 'board'))
    expect(parsed(stream).find(m => m.kind === 'board')).toMatchObject({ board: { onAir: 'pool', mode: 'manual' } })
    const bad = await streamer.post(`/api/clubs/${club.id}/events/${f.eventId}/rings/1/board`, { onAir: 'scoreboard' })
    expect(bad.status).toBe(400)
    expect(bad.data.message).toContain('onAir')
    expect((await streamer.post(`/api/clubs/${club.id}/events/${f.eventId}/rings/1/board`, { mode: 'auto' })).data.board).toEqual({ onAir: 'pool', mode: 'auto' })
  })

  it('keeps the points format\'s match clock on the server: start, stop, adjust, with version checks', async () => {
    const ruleSetId = await makeRuleSet(organizer, club, { timeLimitSeconds: 90 }, 'points-to-seven')
    const { f, match } = await ringWithMatch({ ruleSetId })
    const table = await as(club, 'scorekeeper')
    const clock = (body: unknown) => table.post(`${f.base}/matches/${match.id}/clock`, body)
    const started = await clock({ action: 'start', expectedVersion: 0 })
    expect(started.status).toBe(200)
    expect(started.data.clock).toMatchObject({ elapsedMs: 0, limitMs: 90_000 })
    expect(started.data.clock.runningSince).not.toBeNull()
    expect((await clock({ action: 'start', expectedVersion: 1 })).data.data.fields.action).toBe('The clock is already running')
    await new Promise(resolve => setTimeout(resolve, 150))
    const stopped = await clock({ action: 'stop', expectedVersion: 1 })
    expect(stopped.data.clock.runningSince).toBeNull()
    expect(stopped.data.clock.elapsedMs).toBeGreaterThanOrEqual(150)
    const adjusted = await clock({ action: 'adjust', ms: -100_000, expectedVersion: 2 })
    expect(adjusted.data.clock.elapsedMs).toBe(0)
    expect((await clock({ action: 'adjust', ms: 5000, expectedVersion: 2 })).status).toBe(409)
    expect((await clock({ action: 'pause', expectedVersion: 3 })).data.message).toContain('action')
    expect((await clock({ action: 'adjust', ms: 1.5, expectedVersion: 3 })).data.data.fields.ms).toContain('whole')

    const firstHit = await ringWithMatch()
    const refused = await table.post(`${firstHit.f.base}/matches/${firstHit.match.id}/clock`, { action: 'start', expectedVersion: 0 })
    expect(refused.status).toBe(409)
    expect(refused.data.data.fields.action).toBe('The first-hit format has no match clock')
  })
})

export type { MatchView }
