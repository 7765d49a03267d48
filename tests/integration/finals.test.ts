import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { TestClub } from '../support/fixtures'
import { makeClub, pool, tableCounts } from '../support/fixtures'
import { Client } from '../support/http'
import type { Fixture, MatchView } from '../support/tournament'
import { as, drawPools, fenceMatch, makeFixture, matchBetween } from '../support/tournament'

let club: TestClub
let organizer: Client

const X = 'Hedda Crane'
const Y = 'Alder Mossley'
const Z = 'Bryony Tallis'
const W = 'Cobb Wetherell'
const FOUR = [
  { name: X, clubName: 'Ironquay Fencing Hall' },
  { name: Y, clubName: 'North Downs Buckler Circle' },
  { name: Z, clubName: 'Lanterngate Historical Fencing' },
  { name: W, clubName: 'Greyfield Sword Society' },
]
const RANKED = [X, Y, Z, W]

/** A pool of four fenced so that X > Y > Z > W (everyone wins every bout against those after them), then the finals. */
async function toFinals(options: { finalsFormat?: 'bracket' | 'round-robin', bronzeMatch?: boolean } = {}) {
  const f = await makeFixture(club, organizer, { fighters: FOUR, poolSize: 4, qualifyCount: 4, ...options })
  const pools = await drawPools(f)
  for (const [i, a] of RANKED.entries()) {
    for (const b of RANKED.slice(i + 1)) await fenceMatch(f, matchBetween(pools, a, b), a, 3)
  }
  const res = await organizer.post(`${f.base}/phase`, { to: 'finals' })
  expect(res.status, JSON.stringify(res.data)).toBe(200)
  return f
}

async function finals(f: Fixture) {
  const res = await organizer.get(`${f.base}/bracket`)
  expect(res.status).toBe(200)
  return res.data as { format: string, field: number[], bracket: unknown, table: { complete: boolean, rows: { rank: number, fighter: { name: string } }[] } | null, places: Record<string, unknown>, matches: MatchView[], complete: boolean }
}

const pairOf = (m: MatchView) => [m.sideA?.name ?? null, m.sideB?.name ?? null]
const byKey = (matches: MatchView[], key: string) => matches.find(m => m.bracketKey === key)!

beforeAll(async () => {
  club = await makeClub('finals')
  organizer = await as(club, 'organizer')
})
afterAll(() => pool.end())

describe('a round-robin final', () => {
  it('has the final four fence each other once, in the pool order of four, and places them by the rule set\'s ranking', async () => {
    const f = await toFinals({ finalsFormat: 'round-robin' })
    const first = await finals(f)
    expect(first.format).toBe('round-robin')
    expect(first.bracket).toBeNull()
    expect(first.field).toEqual(RANKED.map(n => f.entries.get(n)))
    // The pool order table for four (1-4 2-3 1-3 2-4 3-4 1-2), positions by the pool ranking.
    expect(first.matches.map(pairOf)).toEqual([[X, W], [Y, Z], [X, Z], [Y, W], [Z, W], [X, Y]])
    expect(first.matches.map(m => m.bracketKey)).toEqual(['rr1', 'rr2', 'rr3', 'rr4', 'rr5', 'rr6'])
    expect(first.places).toEqual({ first: null, second: null, third: [], fourth: null })
    expect(first.table!.complete).toBe(false)

    // Closing the tournament waits for the finals.
    const before = await tableCounts()
    const early = await organizer.post(`${f.base}/phase`, { to: 'done' })
    expect(early.status).toBe(409)
    expect(early.data.data.fields.to).toBe('6 final matches are still to be fenced')
    expect(await tableCounts()).toEqual(before)

    // This time W wins everything, then Z, then Y: the final's own table decides, not the pools.
    const order = [W, Z, Y, X]
    for (const m of first.matches) {
      const [a, b] = pairOf(m) as [string, string]
      await fenceMatch(f, m, order.indexOf(a) < order.indexOf(b) ? a : b, 3)
    }
    const done = await finals(f)
    expect(done.table!.complete).toBe(true)
    expect(done.table!.rows.map(r => r.fighter.name)).toEqual(order)
    expect(done.places).toEqual({ first: f.entries.get(W), second: f.entries.get(Z), third: [f.entries.get(Y)], fourth: f.entries.get(X) })
    expect(done.complete).toBe(true)
    expect((await organizer.post(`${f.base}/phase`, { to: 'done' })).status).toBe(200)
  })

  it('refuses a round robin of more than eight finalists, naming the field', async () => {
    const f = await makeFixture(club, organizer, { fighters: FOUR, poolSize: 4, qualifyCount: 4, startPools: false })
    const res = await organizer.patch(f.base, { finalsFormat: 'round-robin', qualifyCount: 9 })
    expect(res.status).toBe(400)
    expect(res.data.data.fields.qualifyCount).toContain('at most 8')
    const alone = await organizer.patch(f.base, { qualifyCount: 12 })
    expect(alone.status).toBe(200)
    const switched = await organizer.patch(f.base, { finalsFormat: 'round-robin' })
    expect(switched.status).toBe(400)
    expect(switched.data.message).toContain('qualifyCount')
    const ok = await organizer.patch(f.base, { finalsFormat: 'round-robin', qualifyCount: 4, bronzeMatch: false })
    expect(ok.status).toBe(200)
    expect(ok.data).toMatchObject({ finalsFormat: 'round-robin', qualifyCount: 4, bronzeMatch: false })
  })
})

describe('a bracket', () => {
  it('has no bronze match when the tournament does not want one, and closes only when the final is decided', async () => {
    const f = await toFinals({ bronzeMatch: false })
    const first = await finals(f)
    expect(first.matches.map(m => m.bracketKey)).toEqual(['r1m1', 'r1m2', 'r2m1'])
    await fenceMatch(f, byKey(first.matches, 'r1m1'), X, 3)
    await fenceMatch(f, byKey(first.matches, 'r1m2'), Y, 3)
    const early = await organizer.post(`${f.base}/phase`, { to: 'done' })
    expect(early.status).toBe(409)
    expect(early.data.data.fields.to).toBe('1 final match is still to be fenced')
    await fenceMatch(f, byKey((await finals(f)).matches, 'r2m1'), Y, 3)
    const done = await finals(f)
    // Without a bronze match both semifinal losers share third place.
    expect(done.places).toMatchObject({ first: f.entries.get(Y), second: f.entries.get(X), fourth: null })
    expect((done.places.third as number[]).sort()).toEqual([f.entries.get(W)!, f.entries.get(Z)!].sort())
    expect((await organizer.post(`${f.base}/phase`, { to: 'done' })).status).toBe(200)
  })

  it('forfeits the matches of a fighter who withdraws in the finals, and the bracket moves on without them', async () => {
    const f = await toFinals()
    const first = await finals(f)
    // Seed 2 beats seed 3, then withdraws before the final: the final and nothing else is forfeited.
    await fenceMatch(f, byKey(first.matches, 'r1m2'), Y, 3)
    const withdrawn = await organizer.post(`${f.base}/entries/${f.entries.get(Y)}/withdraw`, { reason: 'Wrist injury' })
    expect(withdrawn.status).toBe(200)
    const after = await finals(f)
    // The final waits for its other fighter; once X wins the semifinal, Y forfeits it at once.
    expect(byKey(after.matches, 'r2m1')).toMatchObject({ status: 'scheduled' })
    expect(byKey(after.matches, 'bronze')).toMatchObject({ status: 'scheduled' })
    await fenceMatch(f, byKey(after.matches, 'r1m1'), X, 3)
    const later = await finals(f)
    expect(byKey(later.matches, 'r2m1')).toMatchObject({ status: 'forfeit', winner: byKey(later.matches, 'r2m1').sideA?.name === X ? 'a' : 'b' })
    expect(later.places).toMatchObject({ first: f.entries.get(X), second: f.entries.get(Y) })
    const { rows } = await pool.query(`select forfeit_reason from matches where id = $1`, [byKey(later.matches, 'r2m1').id])
    expect(rows[0].forfeit_reason).toBe('Withdrawn: Wrist injury')

    // A fighter with a match waiting forfeits it when they withdraw.
    const bronze = byKey(later.matches, 'bronze')
    expect(pairOf(bronze).sort()).toEqual([W, Z].sort())
    expect((await organizer.post(`${f.base}/entries/${f.entries.get(W)}/withdraw`, { reason: 'Left the event' })).status).toBe(200)
    const end = await finals(f)
    expect(byKey(end.matches, 'bronze')).toMatchObject({ status: 'forfeit' })
    expect(end.places.third).toEqual([f.entries.get(Z)])
    expect(end.complete).toBe(true)
    // A withdrawal in the finals cannot be taken back: the forfeits stand.
    const undo = await organizer.delete(`${f.base}/entries/${f.entries.get(W)}/withdraw`)
    expect(undo.status).toBe(409)
    expect(undo.data.message).toContain('in the finals')
  })
})

describe('taking a withdrawal back', () => {
  it('returns the fighter as they were before the finals, and says so when there is nothing to undo', async () => {
    const f = await makeFixture(club, organizer, { fighters: FOUR, poolSize: 4, startPools: false })
    const id = f.entries.get(Z)!
    expect((await organizer.post(`${f.base}/entries/${id}/withdraw`, { reason: 'Entered by mistake' })).status).toBe(200)
    const back = await organizer.delete(`${f.base}/entries/${id}/withdraw`)
    expect(back.status).toBe(200)
    expect(back.data).toMatchObject({ status: 'checked-in', withdrawnAt: null, withdrawalReason: null })
    const again = await organizer.delete(`${f.base}/entries/${id}/withdraw`)
    expect(again.status).toBe(409)
    expect(again.data.message).toContain('has not withdrawn')

    // In the pools, a pool member comes back into the table.
    expect((await organizer.post(`${f.base}/phase`, { to: 'pools' })).status).toBe(200)
    await drawPools(f)
    expect((await organizer.post(`${f.base}/entries/${id}/withdraw`, { reason: 'Cramp' })).status).toBe(200)
    let table = (await organizer.get(`${f.base}/standings`)).data
    expect(table.pools[0].rows.find((r: { fighter: { name: string } }) => r.fighter.name === Z).status).toBe('withdrawn')
    expect((await organizer.delete(`${f.base}/entries/${id}/withdraw`)).status).toBe(200)
    table = (await organizer.get(`${f.base}/standings`)).data
    expect(table.pools[0].rows.find((r: { fighter: { name: string } }) => r.fighter.name === Z).status).not.toBe('withdrawn')

    // Only an organizer may, and another club's organizer does not even see the entry.
    expect((await (await as(club, 'scorekeeper')).delete(`${f.base}/entries/${id}/withdraw`)).status).toBe(403)
    expect((await new Client().delete(`${f.base}/entries/${id}/withdraw`)).status).toBe(401)
  })
})
