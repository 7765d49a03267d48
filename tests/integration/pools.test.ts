import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { poolOrder } from '../../shared/tournament'
import type { TestClub } from '../support/fixtures'
import { makeClub, pool, tableCounts } from '../support/fixtures'
import type { Client } from '../support/http'
import type { PoolView } from '../support/tournament'
import { ROSTER, as, clean, drawPools, makeFixture, record } from '../support/tournament'

let club: TestClub
let other: TestClub
let organizer: Client

const names = (pools: readonly PoolView[]) => pools.map(p => p.fighters.map(f => f.name))

// Five fighters in pools of about three: one pool of 3 and one of 2. Two share a club.
const FIVE = [
  { name: 'Hedda Crane', clubName: 'Ironquay Fencing Hall' },
  { name: 'Fenna Rook', clubName: 'Ironquay Fencing Hall' },
  { name: 'Alder Mossley', clubName: 'North Downs Buckler Circle' },
  { name: 'Bryony Tallis', clubName: 'Lanterngate Historical Fencing' },
  { name: 'Cobb Wetherell', clubName: 'Greyfield Sword Society' },
]

beforeAll(async () => {
  club = await makeClub('pools')
  other = await makeClub('pools-other')
  organizer = await as(club, 'organizer')
})
afterAll(() => pool.end())

describe('drawing the pools', () => {
  it('draws only the checked-in fighters, fills rings in turn and orders each pool by the bout order table', async () => {
    const f = await makeFixture(club, organizer, { notCheckedIn: ['Jory Penhale', 'Kestra Lowe'], startPools: false })
    const ilse = f.entries.get('Ilse Marrow')!
    expect((await organizer.post(`${f.base}/entries/${ilse}/withdraw`, { reason: 'Sprained wrist at warm-up' })).status).toBe(200)
    expect((await organizer.post(`${f.base}/phase`, { to: 'pools' })).status).toBe(200)

    const res = await organizer.post(`${f.base}/pools/draw`, { drawKey: 'harvest-morning' })
    expect(res.status).toBe(201)
    expect(res.data).toMatchObject({ drawKey: 'harvest-morning', dryRun: false })
    const pools = res.data.pools as PoolView[]
    // Nine checked in, pools of about five: 5 and 4.
    expect(pools.map(p => p.fighters.length)).toEqual([5, 4])
    expect(pools.map(p => p.ringNumber)).toEqual([1, 2])
    const drawn = names(pools).flat()
    expect(drawn).toHaveLength(9)
    for (const absent of ['Jory Penhale', 'Kestra Lowe', 'Ilse Marrow']) expect(drawn).not.toContain(absent)
    expect(pools.every(p => p.fighters.every(x => x.status === 'checked-in'))).toBe(true)

    for (const p of pools) {
      const n = p.fighters.length
      expect(p.matches).toHaveLength(n * (n - 1) / 2)
      const position = new Map(p.fighters.map(x => [x.entryId, x.position]))
      const order = p.matches.map(m => [position.get(m.sideA!.entryId), position.get(m.sideB!.entryId)])
      expect(order).toEqual(poolOrder(n).map(([a, b]) => [a, b]))
      expect(p.matches.map(m => m.order)).toEqual(Array.from({ length: n * (n - 1) / 2 }, (_, i) => i + 1))
      expect(p.matches.every(m => m.status === 'scheduled' && m.version === 0 && m.score.a === 0)).toBe(true)
    }

    const read = await (await as(club, 'streamer')).get(`${f.base}/pools`)
    expect(read.status).toBe(200)
    expect(names(read.data.pools)).toEqual(names(pools))
  })

  it('gives the same pools for the same draw key; a preview writes nothing and a new draw replaces the old one', async () => {
    const f = await makeFixture(club, organizer, { fighters: ROSTER.slice(0, 10) })
    const before = await tableCounts()
    const first = await organizer.post(`${f.base}/pools/draw`, { drawKey: 'lantern-7', dryRun: true })
    const again = await organizer.post(`${f.base}/pools/draw`, { drawKey: 'lantern-7', dryRun: true })
    expect(first.status).toBe(200)
    expect(first.data.dryRun).toBe(true)
    expect(first.data.pools.every((p: PoolView) => p.id === null)).toBe(true)
    expect(names(again.data.pools)).toEqual(names(first.data.pools))
    expect(await tableCounts()).toEqual(before)

    const drawn = await drawPools(f, 'lantern-7')
    expect(names(drawn)).toEqual(names(first.data.pools))
    const redrawn = await drawPools(f, 'lantern-7')
    expect(names(redrawn)).toEqual(names(drawn))
    const { rows } = await pool.query('select count(*)::int as n from pools where tournament_id = $1', [f.tournamentId])
    expect(rows[0].n).toBe(2)
    const lots = await pool.query('select seed, jsonb_array_length("order") as n from tournament_lots where tournament_id = $1 and scope = $2', [f.tournamentId, 'draw'])
    expect(lots.rows).toEqual([{ seed: 'lantern-7', n: 10 }])

    const random = await organizer.post(`${f.base}/pools/draw`, {})
    expect(random.status).toBe(201)
    expect(random.data.drawKey).toMatch(/^[0-9a-f]{12}$/)
  })

  it('refuses to draw before the pools phase (409), for a scorekeeper (403) and for another club (404), writing nothing', async () => {
    const f = await makeFixture(club, organizer, { fighters: FIVE, startPools: false })
    const before = await tableCounts()
    const early = await organizer.post(`${f.base}/pools/draw`, {})
    expect(early.status).toBe(409)
    expect(early.data.message).toMatch(/Start the pools phase first/)
    expect((await organizer.post(`${f.base}/phase`, { to: 'pools' })).status).toBe(200)
    const afterPhase = await tableCounts()
    expect((await (await as(club, 'scorekeeper')).post(`${f.base}/pools/draw`, {})).status).toBe(403)
    expect((await (await as(club, 'admin')).post(`${f.base}/pools/draw`, {})).status).toBe(403)
    expect((await (await as(other, 'organizer')).post(`${f.base}/pools/draw`, {})).status).toBe(404)
    const bad = await organizer.post(`${f.base}/pools/draw`, { drawKey: '', dryRun: 'yes' })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.data.data.fields).sort()).toEqual(['drawKey', 'dryRun'])
    expect((await organizer.post(`${f.base}/pools/draw`, { size: 4 })).status).toBe(400)
    expect(await tableCounts()).toEqual(afterPhase)
    expect(afterPhase.pools).toBe(before.pools)
  })
})

describe('moving fighters', () => {
  it('moves a fighter to another pool, rebuilds both bout orders and warns about a club clash', async () => {
    const f = await makeFixture(club, organizer, { fighters: FIVE, poolSize: 3 })
    const pools = await drawPools(f)
    expect(pools.map(p => p.fighters.length)).toEqual([3, 2])
    // The draw parts the two Ironquay fighters; the one in the pool of three joins the other.
    const big = pools[0]!
    const small = pools[1]!
    const mover = big.fighters.find(x => x.clubName === 'Ironquay Fencing Hall')!
    expect(small.fighters.some(x => x.clubName === 'Ironquay Fencing Hall')).toBe(true)

    const res = await organizer.post(`${f.base}/pools/${big.id}/move`, { entryId: mover.entryId, toPoolId: small.id })
    expect(res.status).toBe(200)
    expect(res.data.warnings).toEqual([{ kind: 'same-club', message: `${mover.name} joins fighters of the same club (Ironquay Fencing Hall) in pool 2` }])
    const [one, two] = res.data.pools as PoolView[]
    expect(one!.fighters.map(x => x.name)).not.toContain(mover.name)
    expect(two!.fighters.map(x => x.name)).toContain(mover.name)
    expect([one!.matches.length, two!.matches.length]).toEqual([1, 3])
    expect(two!.fighters.map(x => x.position)).toEqual([1, 2, 3])
    const fighters = new Set(two!.matches.flatMap(m => [m.sideA!.entryId, m.sideB!.entryId]))
    expect(fighters).toEqual(new Set(two!.fighters.map(x => x.entryId)))
  })

  it('refuses a move that would leave a pool too small, to the same pool, or of a fighter not in the pool, writing nothing', async () => {
    const f = await makeFixture(club, organizer, { fighters: FIVE, poolSize: 3 })
    const [big, small] = await drawPools(f)
    const before = await tableCounts()
    const move = (from: PoolView, entryId: number, toPoolId: number) => organizer.post(`${f.base}/pools/${from.id}/move`, { entryId, toPoolId })

    const tooSmall = await move(small!, small!.fighters[0]!.entryId, big!.id)
    expect(tooSmall.status).toBe(409)
    expect(tooSmall.data.message).toBe('Pool 2 would keep 1 fighter, fewer than 2')
    const same = await move(big!, big!.fighters[0]!.entryId, big!.id)
    expect(same.status).toBe(409)
    expect(same.data.data.fields.toPoolId).toMatch(/is already in pool 1/)
    const notThere = await move(big!, small!.fighters[0]!.entryId, small!.id)
    expect(notThere.status).toBe(400)
    expect(notThere.data.data.fields.entryId).toBe('This fighter is not in pool 1')
    const nowhere = await move(big!, big!.fighters[0]!.entryId, 2147483000)
    expect(nowhere.status).toBe(400)
    expect(nowhere.data.data.fields.toPoolId).toMatch(/No pool/)
    const missing = await organizer.post(`${f.base}/pools/${big!.id}/move`, { entryId: 'Hedda' })
    expect(Object.keys(missing.data.data.fields).sort()).toEqual(['entryId', 'toPoolId'])
    expect((await organizer.post(`${f.base}/pools/2147483000/move`, { entryId: 1, toPoolId: 1 })).status).toBe(404)
    expect((await (await as(club, 'scorekeeper')).post(`${f.base}/pools/${big!.id}/move`, { entryId: 1, toPoolId: small!.id })).status).toBe(403)
    expect(await tableCounts()).toEqual(before)
  })

  it('settles the pools once a match has an entry: no new draw and no moves (409), nothing written', async () => {
    const f = await makeFixture(club, organizer, { fighters: FIVE, poolSize: 3 })
    const [big, small] = await drawPools(f)
    const scorekeeper = await as(club, 'scorekeeper')
    expect((await record(scorekeeper, f.base, big!.matches[0]!.id, [clean('a')], 0)).status).toBe(201)
    const before = await tableCounts()
    const draw = await organizer.post(`${f.base}/pools/draw`, {})
    expect(draw.status).toBe(409)
    expect(draw.data.message).toMatch(/already has entries/)
    const moveOut = await organizer.post(`${f.base}/pools/${big!.id}/move`, { entryId: big!.fighters[0]!.entryId, toPoolId: small!.id })
    expect(moveOut.status).toBe(409)
    expect(moveOut.data.message).toMatch(/already has entries or a result/)
    expect(await tableCounts()).toEqual(before)
  })
})

describe('rings', () => {
  it('moves a pool to another ring of the event, and only to one it has', async () => {
    const f = await makeFixture(club, organizer, { fighters: FIVE, poolSize: 3, rings: 2 })
    const [first] = await drawPools(f)
    const moved = await organizer.patch(`${f.base}/pools/${first!.id}`, { ringNumber: 2 })
    expect(moved.status).toBe(200)
    expect(moved.data).toMatchObject({ id: first!.id, ringNumber: 2 })
    const before = await tableCounts()
    const beyond = await organizer.patch(`${f.base}/pools/${first!.id}`, { ringNumber: 3 })
    expect(beyond.status).toBe(400)
    expect(beyond.data.data.fields.ringNumber).toBe('The event has 2 rings')
    expect((await organizer.patch(`${f.base}/pools/${first!.id}`, { ringNumber: 0 })).data.data.fields.ringNumber).toBe('Rings are numbered from 1')
    expect((await (await as(club, 'scorekeeper')).patch(`${f.base}/pools/${first!.id}`, { ringNumber: 1 })).status).toBe(403)
    expect(await tableCounts()).toEqual(before)
  })
})
