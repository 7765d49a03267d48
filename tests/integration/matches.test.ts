import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { TestClub } from '../support/fixtures'
import { makeClub, pool, tableCounts } from '../support/fixtures'
import { Client } from '../support/http'
import type { Fixture, PoolView } from '../support/tournament'
import { CHECKS, afterblow, as, clean, double, drawPools, makeFixture, makeRuleSet, record, voided } from '../support/tournament'

let club: TestClub
let other: TestClub
let organizer: Client
let scorekeeper: Client

// Four fighters in one pool of four: six matches.
const FOUR = [
  { name: 'Hedda Crane', clubName: 'Ironquay Fencing Hall' },
  { name: 'Alder Mossley', clubName: 'North Downs Buckler Circle' },
  { name: 'Bryony Tallis', clubName: 'Lanterngate Historical Fencing' },
  { name: 'Cobb Wetherell', clubName: 'Greyfield Sword Society' },
]

async function pooled(): Promise<{ f: Fixture, pools: PoolView[] }> {
  const f = await makeFixture(club, organizer, { fighters: FOUR, poolSize: 4 })
  return { f, pools: await drawPools(f) }
}

async function storedCount(matchId: number) {
  const { rows } = await pool.query('select count(*)::int as n from match_entries where match_id = $1', [matchId])
  return rows[0].n as number
}

beforeAll(async () => {
  club = await makeClub('matches')
  other = await makeClub('matches-other')
  organizer = await as(club, 'organizer')
  scorekeeper = await as(club, 'scorekeeper')
})
afterAll(() => pool.end())

describe('recording a match', () => {
  it('enters a first-hit match after the fact: a clean hit, a void, an afterblow and a double', async () => {
    // The preset "first hit, three bouts": head 3, torso 2, arms 1; an afterblow counts both hits
    // in full; a double scores nothing; a void bout is fenced again and does not count.
    //   1. clean, a hits b on the head (cut)        a 3 : b 0   a unharmed, b hit
    //   2. void (not seen)                           no bout
    //   3. afterblow, b hits a on the torso first,
    //      a answers on the arm                      a 4 : b 2   both hit
    //   4. double, a torso / b head                  a 4 : b 2   both hit; the third bout ends the match
    // Result: a wins 4–2; three bouts counted, one void; unharmed bouts a 1, b 0.
    const { f, pools } = await pooled()
    const match = pools[0]!.matches[0]!
    const entries = [
      clean('a', 'head', 'cut', 'm1-1'),
      voided('not-seen', 'm1-2'),
      afterblow('b', ['torso', 'cut'], ['arms', 'cut'], 'm1-3'),
      double(['torso', 'thrust'], ['head', 'cut'], 'm1-4'),
    ]
    const res = await record(scorekeeper, f.base, match.id, entries, 0)
    expect(res.status).toBe(201)
    expect(res.data.stored).toEqual(['m1-1', 'm1-2', 'm1-3', 'm1-4'])
    expect(res.data.duplicates).toEqual([])
    expect(res.data.match).toMatchObject({
      id: match.id, status: 'finished', version: 1, score: { a: 4, b: 2 }, bouts: { counted: 3, void: 1 },
      winner: 'a', finishedReason: 'bouts',
    })
    expect(res.data.state.sides.a.unharmedBouts).toBe(1)
    expect(res.data.state.sides.b.unharmedBouts).toBe(0)
    expect(res.data.state.doubles).toBe(1)

    const read = await (await as(club, 'commentator')).get(`${f.base}/matches/${match.id}`)
    expect(read.status).toBe(200)
    expect(read.data.entries.map((e: { id: string, seq: number }) => [e.id, e.seq])).toEqual([['m1-1', 1], ['m1-2', 2], ['m1-3', 3], ['m1-4', 4]])
    expect(read.data.entries[2].payload).toEqual(entries[2])
    expect(Date.parse(read.data.entries[0].recordedAt)).toBeGreaterThan(Date.now() - 60_000)
    expect(read.data.state.sides.a.points).toBe(4)
    expect(read.data.rules).toMatchObject({ format: 'first-hit', boutsPerMatch: 3 })
    const { rows } = await pool.query('select status, started_at is not null as started, finished_at is not null as finished from matches where id = $1', [match.id])
    expect(rows[0]).toEqual({ status: 'finished', started: true, finished: true })
  })

  it('stores an entry sent twice once, and answers it as a duplicate', async () => {
    const { f, pools } = await pooled()
    const match = pools[0]!.matches[1]!
    const hit = clean('a', 'torso', 'cut', 'wifi-1')
    const first = await record(scorekeeper, f.base, match.id, [hit], 0)
    expect(first.status).toBe(201)
    expect(first.data).toMatchObject({ stored: ['wifi-1'], duplicates: [] })
    // The desk did not see the answer and sends the same entry again, with the version it had.
    const again = await record(scorekeeper, f.base, match.id, [hit], 0)
    expect(again.status).toBe(200)
    expect(again.data).toMatchObject({ stored: [], duplicates: ['wifi-1'] })
    expect(again.data.match.version).toBe(1)
    expect(again.data.state.bouts).toBe(1)
    // The same id in one request counts once as well.
    const twice = clean('b', 'legs', 'cut', 'wifi-2')
    const pair = await record(scorekeeper, f.base, match.id, [hit, twice, twice], 1)
    expect(pair.status).toBe(201)
    expect(pair.data).toMatchObject({ stored: ['wifi-2'], duplicates: ['wifi-1', 'wifi-2'] })
    expect(pair.data.match).toMatchObject({ version: 2, score: { a: 2, b: 1 } })
    expect(await storedCount(match.id)).toBe(2)
  })

  it('stores an entry once when two desks send it at the same moment', async () => {
    const { f, pools } = await pooled()
    const match = pools[0]!.matches[4]!
    const hit = clean('b', 'head', 'thrust', 'race-1')
    const answers = await Promise.all([
      record(scorekeeper, f.base, match.id, [hit], 0),
      record(organizer, f.base, match.id, [hit], 0),
    ])
    expect(answers.map(r => r.status).sort()).toEqual([200, 201])
    expect(answers.map(r => r.data.match.version)).toEqual([1, 1])
    expect(await storedCount(match.id)).toBe(1)
  })

  it('refuses a stale expectedVersion with 409 and the current state, storing nothing', async () => {
    const { f, pools } = await pooled()
    const match = pools[0]!.matches[2]!
    expect((await record(scorekeeper, f.base, match.id, [clean('a')], 0)).status).toBe(201)
    const before = await tableCounts()
    const late = await record(organizer, f.base, match.id, [clean('b')], 0)
    expect(late.status).toBe(409)
    expect(late.data.data.fields.expectedVersion).toBe('The match is at version 1')
    expect(late.data.data.match).toMatchObject({ id: match.id, version: 1, status: 'under-way', score: { a: 2, b: 0 } })
    expect(late.data.data.state.bouts).toBe(1)
    expect(await tableCounts()).toEqual(before)
    expect((await record(organizer, f.base, match.id, [clean('b')], 1)).status).toBe(201)
  })

  it('refuses entries after the match has ended (409), also within one request', async () => {
    const { f, pools } = await pooled()
    const [done, fresh] = pools[0]!.matches
    expect((await record(scorekeeper, f.base, done!.id, [clean('a'), clean('a'), clean('b')], 0)).status).toBe(201)
    const before = await tableCounts()
    const after = await record(scorekeeper, f.base, done!.id, [clean('b')], 1)
    expect(after.status).toBe(409)
    expect(after.data.message).toMatch(/has ended/)
    const overflow = await record(scorekeeper, f.base, fresh!.id, [clean('a'), clean('a'), clean('a'), clean('b')], 0)
    expect(overflow.status).toBe(409)
    expect(overflow.data.data.fields).toHaveProperty('entries.3')
    expect(await tableCounts()).toEqual(before)
  })

  it('names the entry and the field of a bad entry (400) and stores nothing', async () => {
    const { f, pools } = await pooled()
    const match = pools[0]!.matches[0]!
    const before = await tableCounts()
    const post = (body: unknown) => scorekeeper.post(`${f.base}/matches/${match.id}/entries`, body)
    const side = await post({ expectedVersion: 0, entries: [clean('a'), { kind: 'clean', id: 'x2', side: 'c', target: 'head', action: 'cut' }] })
    expect(side.status).toBe(400)
    expect(side.data.data.fields).toEqual({ 'entries.1.side': 'choose a or b' })
    const kind = await post({ expectedVersion: 0, entries: [{ kind: 'parry', id: 'x3' }] })
    expect(kind.data.data.fields).toEqual({ 'entries.0.kind': 'unknown entry kind' })
    const timeUp = await post({ expectedVersion: 0, entries: [clean('a'), { kind: 'time-up', id: 'x4' }] })
    expect(timeUp.status).toBe(400)
    expect(timeUp.data.data.fields['entries.1.kind']).toMatch(/time-up needs a points rule set/)
    const cancel = await post({ expectedVersion: 0, entries: [{ kind: 'cancel', id: 'x5', targetId: 'never-sent' }] })
    expect(cancel.status).toBe(400)
    expect(cancel.data.data.fields['entries.0.targetId']).toMatch(/names no earlier entry/)
    const noVersion = await post({ entries: [clean('a')] })
    expect(noVersion.data.data.fields.expectedVersion).toMatch(/version/)
    expect((await post({ expectedVersion: 0, entries: [] })).data.data.fields.entries).toBe('Send at least one entry')
    expect((await post({ expectedVersion: 0, entries: ['hit'] })).data.data.fields['entries.0']).toMatch(/as an object/)
    expect((await scorekeeper.request('POST', `${f.base}/matches/${match.id}/entries`, { body: 'expectedVersion=0', headers: { 'content-type': 'text/plain' } })).status).toBe(415)
    expect(await tableCounts()).toEqual(before)
  })

  it('takes back an entry with a cancel in the same log', async () => {
    const { f, pools } = await pooled()
    const match = pools[0]!.matches[3]!
    const res = await record(scorekeeper, f.base, match.id, [clean('a', 'head', 'cut', 'c-1'), { kind: 'cancel', id: 'c-2', targetId: 'c-1' }, clean('b', 'legs', 'cut', 'c-3')], 0)
    expect(res.status).toBe(201)
    expect(res.data.match).toMatchObject({ score: { a: 0, b: 1 }, bouts: { counted: 1, void: 0 }, status: 'under-way' })
    expect(await storedCount(match.id)).toBe(3)
  })
})

describe('who may record', () => {
  it('lets a scorekeeper record entries but not draw pools or record a forfeit (403)', async () => {
    const { f, pools } = await pooled()
    const match = pools[0]!.matches[0]!
    expect((await record(scorekeeper, f.base, match.id, [clean('a')], 0)).status).toBe(201)
    const before = await tableCounts()
    expect((await scorekeeper.post(`${f.base}/pools/draw`, {})).status).toBe(403)
    expect((await scorekeeper.post(`${f.base}/matches/${match.id}/forfeit`, { side: 'a', reason: 'Injury' })).status).toBe(403)
    for (const role of ['streamer', 'commentator', 'editor', 'admin'] as const) {
      const member = await as(club, role)
      expect((await record(member, f.base, match.id, [clean('b')], 1)).status, role).toBe(403)
    }
    expect(await tableCounts()).toEqual(before)
  })

  it('hides matches from another club (404) and from anonymous callers (401)', async () => {
    const { f, pools } = await pooled()
    const match = pools[0]!.matches[0]!
    const outsider = await as(other, 'organizer')
    const before = await tableCounts()
    const attempts = [
      await outsider.get(`${f.base}/matches/${match.id}`),
      await outsider.get(`${f.base}/matches`),
      await outsider.get(`${f.base}/pools`),
      await outsider.get(`${f.base}/standings`),
      await record(outsider, f.base, match.id, [clean('a')], 0),
      await outsider.post(`${f.base}/matches/${match.id}/forfeit`, { side: 'a', reason: 'Injury' }),
      await outsider.get(`/api/clubs/${club.id}/events/${f.eventId}/schedule`),
    ]
    expect(attempts.map(r => r.status)).toEqual([404, 404, 404, 404, 404, 404, 404])
    expect((await organizer.get(`${f.base}/matches/2147483000`)).status).toBe(404)
    const anon = new Client()
    expect((await anon.get(`${f.base}/matches/${match.id}`)).status).toBe(401)
    expect((await anon.post(`${f.base}/matches/${match.id}/entries`, { expectedVersion: 0, entries: [clean('a')] })).status).toBe(401)
    expect(await tableCounts()).toEqual(before)
  })
})

describe('listing matches and the schedule', () => {
  it('lists the matches of a pool or a stage, and names a bad filter', async () => {
    const { f, pools } = await pooled()
    const all = await organizer.get(`${f.base}/matches`)
    expect(all.data.matches).toHaveLength(6)
    const byPool = await organizer.get(`${f.base}/matches?poolId=${pools[0]!.id}&stage=pool`)
    expect(byPool.data.matches.map((m: { id: number }) => m.id)).toEqual(pools[0]!.matches.map(m => m.id))
    expect((await organizer.get(`${f.base}/matches?stage=final`)).data.matches).toEqual([])
    const bad = await organizer.get(`${f.base}/matches?stage=semifinal`)
    expect(bad.status).toBe(400)
    expect(bad.data.data.fields.stage).toBe('Use one of: pool, final')
    expect((await organizer.get(`${f.base}/matches?poolId=2147483000`)).status).toBe(404)
  })

  it('shows each ring what it fences now, on deck and next', async () => {
    const { f, pools } = await pooled()
    const [first, second, third] = pools[0]!.matches
    const path = `/api/clubs/${club.id}/events/${f.eventId}/schedule`
    const before = await (await as(club, 'streamer')).get(path)
    expect(before.status).toBe(200)
    expect(before.data.rings).toHaveLength(3)
    const ring1 = before.data.rings[0]
    expect(ring1).toMatchObject({ ringId: 1, now: null, later: 4 })
    expect(ring1.onDeck).toMatchObject({ matchId: first!.id, status: 'pending', stage: 'pool', poolNumber: 1 })
    expect(ring1.next.matchId).toBe(second!.id)
    // First hit, three bouts: 3 × 1.5 minutes per match.
    expect(ring1.onDeck.end - ring1.onDeck.start).toBe(4.5 * 60_000)
    expect(before.data.rings[1]).toMatchObject({ ringId: 2, now: null, onDeck: null, next: null, later: 0 })

    expect((await record(scorekeeper, f.base, first!.id, [clean('a')], 0)).status).toBe(201)
    const during = await organizer.get(path)
    expect(during.data.rings[0].now).toMatchObject({ matchId: first!.id, status: 'underway' })
    expect(during.data.rings[0].onDeck.matchId).toBe(second!.id)
    expect(during.data.rings[0].next.matchId).toBe(third!.id)
  })

  it('gives every ring a timeline of its matches still to fence, in bout order, with estimated start and end', async () => {
    const { f, pools } = await pooled()
    const path = `/api/clubs/${club.id}/events/${f.eventId}/schedule`
    const minute = 60_000
    const ids = pools[0]!.matches.map(m => m.id)
    const before = (await organizer.get(path)).data
    expect(before.tournaments).toEqual([{ id: f.tournamentId, name: 'Sword and buckler', phase: 'pools', matchMinutes: 4.5 }])
    const [ring1, ring2, ring3] = before.rings
    expect(ring1.timeline.map((m: TimelineMatch) => m.matchId)).toEqual(ids)
    expect(ring1.timeline.every((m: TimelineMatch) => m.status === 'pending')).toBe(true)
    expect(ring1.timeline[0].sideA.name).toBe(pools[0]!.matches[0]!.sideA!.name)
    // First hit, three bouts: 3 × 1.5 minutes a match, and a minute's changeover between matches.
    expect(Date.parse(ring1.timeline[0].startsAt)).toBe(Date.parse(before.at))
    for (const [i, m] of (ring1.timeline as TimelineMatch[]).entries()) {
      expect(Date.parse(m.endsAt) - Date.parse(m.startsAt)).toBe(4.5 * minute)
      if (i > 0) expect(Date.parse(m.startsAt) - Date.parse(ring1.timeline[i - 1].endsAt)).toBe(minute)
    }
    expect(ring1.end).toBe(ring1.timeline.at(-1).endsAt)
    expect(before.end).toBe(ring1.end)
    expect(ring1.finished).toBe(0)
    expect([ring2, ring3].map(r => [r.timeline, r.end])).toEqual([[[], null], [[], null]])

    // The first match under way keeps its place at the top; once finished it leaves the timeline.
    const started = await record(scorekeeper, f.base, ids[0]!, [clean('a')], 0)
    expect(started.status).toBe(201)
    const during = (await organizer.get(path)).data.rings[0]
    expect(during.timeline.map((m: TimelineMatch) => [m.matchId, m.status])).toEqual(ids.map((id, i) => [id, i === 0 ? 'underway' : 'pending']))
    expect((await record(scorekeeper, f.base, ids[0]!, [clean('a'), clean('a')], started.data.match.version)).status).toBe(201)
    const after = (await organizer.get(path)).data
    expect(after.rings[0].timeline.map((m: TimelineMatch) => m.matchId)).toEqual(ids.slice(1))
    expect(after.rings[0].finished).toBe(1)
    expect(Date.parse(after.rings[0].timeline[0].startsAt)).toBe(Date.parse(after.at))
  })

  it('makes a ring wait for a fighter entered in two tournaments, and names the clash in words', async () => {
    const { f, pools } = await pooled()
    const shared = pools[0]!.fighters.find(x => x.name === 'Hedda Crane')!
    // A second tournament in the same event, fenced in ring 2, with the same fighter and three more.
    const second = await organizer.post(`/api/clubs/${club.id}/events/${f.eventId}/tournaments`, {
      name: 'Longsword', weapon: 'longsword', ruleSetId: await makeRuleSet(organizer, club), poolSize: 4,
    })
    expect(second.status).toBe(201)
    const base = `/api/clubs/${club.id}/events/${f.eventId}/tournaments/${second.data.id}`
    const others = await Promise.all(['Ivo Penhallow', 'Lowdy Carne', 'Senara Bolitho'].map(async (name) => {
      const res = await organizer.post(`/api/clubs/${club.id}/fighters`, { name, clubName: 'Old Mill Fencing School' })
      if (res.status === 201) return res.data.id as number
      return (await organizer.get(`/api/clubs/${club.id}/fighters?q=${encodeURIComponent(name)}`)).data.fighters[0].id as number
    }))
    for (const fighterId of [shared.fighterId, ...others]) {
      const entry = await organizer.post(`${base}/entries`, { fighterId, seed: null })
      expect(entry.status).toBe(201)
      expect((await organizer.post(`${base}/entries/${entry.data.id}/check-in`, CHECKS)).status).toBe(200)
    }
    expect((await organizer.post(`${base}/phase`, { to: 'pools' })).status).toBe(200)
    const drawn = await organizer.post(`${base}/pools/draw`, { drawKey: 'harvest' })
    expect(drawn.status).toBe(201)
    expect((await organizer.patch(`${base}/pools/${drawn.data.pools[0].id}`, { ringNumber: 2 })).status).toBe(200)

    // In a pool of four every two positions meet in one round of the same number (1-4 2-3 1-3 2-4
    // 3-4 1-2), and both rings keep pace until then: one ring has to wait for the shared fighter.
    const res = await organizer.get(`/api/clubs/${club.id}/events/${f.eventId}/schedule`)
    expect(res.status).toBe(200)
    const { rings, conflicts } = res.data as { rings: { ringId: number, timeline: TimelineMatch[] }[], conflicts: Conflict[] }
    expect(rings[0]!.timeline).toHaveLength(6)
    expect(rings[1]!.timeline).toHaveLength(6)
    const wait = conflicts.find(c => c.kind === 'fighter-waits')!
    expect(wait).toMatchObject({ fighterId: shared.fighterId, fighterName: 'Hedda Crane' })
    expect(wait.message).toContain(`waits about ${Math.round(wait.minutes)} min for Hedda Crane`)
    expect(wait.message).toMatch(/Sword and buckler, pool 1/)
    expect(wait.message).toMatch(/Longsword, pool 1/)
    expect(wait.message).not.toMatch(/fighter \d|match \d/)
    // The waiting match starts when the fighter's other match should end, plus 2 minutes to change rings.
    const all = rings.flatMap(r => r.timeline)
    const waiting = all.find(m => m.matchId === wait.matchId)!
    const busy = all.find(m => m.matchId === wait.otherMatchId)!
    expect(waiting.ringId).not.toBe(busy.ringId)
    expect(Date.parse(waiting.startsAt) - Date.parse(busy.endsAt)).toBe(2 * 60_000)
  })
})

interface TimelineMatch { matchId: number, ringId: number, status: string, startsAt: string, endsAt: string, sideA: { name: string } }
interface Conflict { kind: string, matchId: number, otherMatchId: number, fighterId: number | null, fighterName: string | null, minutes: number, message: string }
