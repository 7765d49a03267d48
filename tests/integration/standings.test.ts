import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { TestClub } from '../support/fixtures'
import { makeClub, pool, tableCounts } from '../support/fixtures'
import { Client } from '../support/http'
import type { Fixture, MatchView, PoolView } from '../support/tournament'
import { as, clean, double, drawPools, fenceMatch, makeFixture, makeRuleSet, matchBetween, record, sideOf } from '../support/tournament'

let club: TestClub
let organizer: Client

const X = 'Hedda Crane'
const Y = 'Alder Mossley'
const Z = 'Bryony Tallis'
const W = 'Cobb Wetherell'
const THREE = [
  { name: X, clubName: 'Ironquay Fencing Hall' },
  { name: Y, clubName: 'North Downs Buckler Circle' },
  { name: Z, clubName: 'Lanterngate Historical Fencing' },
]
const FOUR = [...THREE, { name: W, clubName: 'Greyfield Sword Society' }]

interface Row { rank: number, fighter: { entryId: number, name: string }, [key: string]: unknown }

/** Fences a first-hit match bout by bout: each bout a clean hit on a target by the named fighter, or a double. */
async function fence(f: Fixture, match: MatchView, bouts: ([string, 'head' | 'torso' | 'arms'] | 'double')[]) {
  const entries = bouts.map(bout => (bout === 'double' ? double() : clean(sideOf(match, bout[0]), bout[1])))
  const res = await record(f.organizer, f.base, match.id, entries)
  expect(res.status, JSON.stringify(res.data)).toBe(201)
}

async function standings(f: Fixture, client: Client = organizer) {
  const res = await client.get(`${f.base}/standings`)
  expect(res.status).toBe(200)
  return res.data
}

async function lotRows(tournamentId: number) {
  const { rows } = await pool.query(`select scope, seed, fighters, "order" from tournament_lots where tournament_id = $1 and scope <> 'draw' order by id`, [tournamentId])
  return rows as { scope: string, seed: string, fighters: string, order: string[] }[]
}

beforeAll(async () => {
  club = await makeClub('standings')
  organizer = await as(club, 'organizer')
})
afterAll(() => pool.end())

describe('pool standings', () => {
  it('ranks by unharmed bouts first, then the tie-breakers, then a recorded lot that stays the same', async () => {
    // The preset "first hit, three bouts" ranks by unharmed bouts, points scored, points received,
    // doubles, head to head, then the lot. Head 3, torso 2, arms 1; a double scores nothing.
    //   X–Y: X arms, X arms, Y head    → Y wins 3–2 on points; X unharmed 2, Y unharmed 1
    //   X–Z: the same                  → Z wins 3–2;            X unharmed 2, Z unharmed 1
    //   Y–Z: Y torso, Z torso, double  → draw 2–2;              Y and Z unharmed 1 each
    // X: 0 wins, 4 unharmed of 6 bouts (66.7%), scored 4, received 6 → first on unharmed bouts.
    // Y and Z: 1 win, 1 draw, 2 unharmed, scored 5, received 4, 1 double, a draw between them:
    // level on everything, so the lot separates them.
    const f = await makeFixture(club, organizer, { fighters: THREE, poolSize: 3, qualifyCount: 2 })
    const pools = await drawPools(f)
    await fence(f, matchBetween(pools, X, Y), [[X, 'arms'], [X, 'arms'], [Y, 'head']])
    await fence(f, matchBetween(pools, X, Z), [[X, 'arms'], [X, 'arms'], [Z, 'head']])

    const early = await standings(f)
    expect(early.pools[0]).toMatchObject({ complete: false, lot: { seed: null, provisional: true } })
    expect(await lotRows(f.tournamentId)).toEqual([])

    await fence(f, matchBetween(pools, Y, Z), [[Y, 'torso'], [Z, 'torso'], 'double'])
    const res = await standings(f, await as(club, 'editor'))
    const table = res.pools[0]
    expect(table.complete).toBe(true)
    const [first, second, third] = table.rows as Row[]
    expect(first).toMatchObject({
      rank: 1, fighter: { name: X }, wins: 0, losses: 2, draws: 0, boutsFought: 6, unharmed: 4,
      scored: 4, received: 6, indicator: -2, doubles: 0, status: 'secured', separatedBy: 'unharmedBouts',
    })
    expect(first!.survivalRate).toBeCloseTo(4 / 6, 10)
    for (const row of [second!, third!]) {
      expect(row).toMatchObject({ wins: 1, losses: 0, draws: 1, boutsFought: 6, unharmed: 2, scored: 5, received: 4, indicator: 1, doubles: 1 })
      expect(row.survivalRate).toBeCloseTo(2 / 6, 10)
    }
    expect(new Set([second!.fighter.name, third!.fighter.name])).toEqual(new Set([Y, Z]))
    expect(second!.separatedBy).toBe('lot')
    expect([second!.rank, third!.rank]).toEqual([2, 3])

    const lot = table.lot
    expect(lot.provisional).toBe(false)
    expect(lot.seed).toMatch(/^[0-9a-f]{16}$/)
    expect(lot.draws).toHaveLength(1)
    expect(lot.draws[0].order).toEqual([second!.fighter.entryId, third!.fighter.entryId])
    const recorded = await lotRows(f.tournamentId)
    const poolLot = recorded.find(r => r.scope === `pool:${pools[0]!.id}`)!
    expect(poolLot).toMatchObject({ seed: lot.seed, order: [String(second!.fighter.entryId), String(third!.fighter.entryId)] })
    expect(poolLot.fighters.split(',').sort()).toEqual([String(second!.fighter.entryId), String(third!.fighter.entryId)].sort())

    // Asked again (by anyone), the table keeps its lot and nothing more is recorded.
    const counts = await tableCounts()
    for (let i = 0; i < 3; i++) {
      const again = await standings(f, await as(club, 'streamer'))
      expect(again.pools[0].rows.map((r: Row) => r.fighter.name)).toEqual(table.rows.map((r: Row) => r.fighter.name))
      expect(again.pools[0].lot.seed).toBe(lot.seed)
    }
    expect(await tableCounts()).toEqual(counts)

    // Two reach the finals: X and the lot's winner; the table is final, so the outlook is too.
    expect(res.cut).toEqual({ topN: 2, minSurvivalRate: null })
    expect(res.overall.rows[0].fighter.name).toBe(X)
    const outlook = new Map(res.qualification.fighters.map((o: { fighter: { name: string }, status: string }) => [o.fighter.name, o.status]))
    expect(res.qualification).toMatchObject({ scope: 'overall', topN: 2, complete: true })
    expect(outlook.get(X)).toBe('secured')
    expect(outlook.get(res.overall.rows[1].fighter.name)).toBe('secured')
    expect(outlook.get(res.overall.rows[2].fighter.name)).toBe('out')
    expect(table.rows.map((r: Row) => r.status)).toEqual(table.rows.map((r: Row) => outlook.get(r.fighter.name)))
  })

  it('records a forfeit (the other side wins) and refuses anything after it', async () => {
    const f = await makeFixture(club, organizer, { fighters: THREE, poolSize: 3 })
    const pools = await drawPools(f)
    const xy = matchBetween(pools, X, Y)
    const path = `${f.base}/matches/${xy.id}/forfeit`
    const res = await organizer.post(path, { side: sideOf(xy, Y), reason: '  Suspected concussion,   withdrawn by the director ' })
    expect(res.status).toBe(200)
    expect(res.data.match).toMatchObject({
      status: 'forfeit', winner: sideOf(xy, X), finishedReason: 'forfeit',
      forfeit: { side: sideOf(xy, Y), reason: 'Suspected concussion, withdrawn by the director' },
    })
    const before = await tableCounts()
    expect((await organizer.post(path, { side: sideOf(xy, X), reason: 'Again' })).status).toBe(409)
    expect((await record(organizer, f.base, xy.id, [clean('a')])).status).toBe(409)
    const bad = await organizer.post(path, { side: 'c', reason: '' })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.data.data.fields).sort()).toEqual(['reason', 'side'])
    expect(await tableCounts()).toEqual(before)

    const rows = (await standings(f)).pools[0].rows as Row[]
    const x = rows.find(r => r.fighter.name === X)!
    const y = rows.find(r => r.fighter.name === Y)!
    expect(x).toMatchObject({ wins: 1, forfeitWins: 1, boutsFought: 0, matchesFought: 0 })
    expect(y).toMatchObject({ losses: 1, forfeitLosses: 1 })
  })

  it('follows the rule set for a withdrawn fighter: annul-all removes their matches, forfeit-remaining gives the rest away', async () => {
    const annul = await makeFixture(club, organizer, { fighters: THREE, poolSize: 3 })
    const annulPools = await drawPools(annul)
    await fenceMatch(annul, matchBetween(annulPools, X, Z), X, 3)
    expect((await organizer.post(`${annul.base}/entries/${annul.entries.get(Z)}/withdraw`, { reason: 'Left after an injury' })).status).toBe(200)
    const annulled = (await standings(annul)).pools[0]
    const ax = annulled.rows.find((r: Row) => r.fighter.name === X)
    expect(ax).toMatchObject({ boutsFought: 0, unharmed: 0, wins: 0 })
    expect(annulled.rows[2]).toMatchObject({ fighter: { name: Z }, status: 'withdrawn', rank: 3, boutsFought: 0 })

    const rules = await makeRuleSet(organizer, club, { withdrawn: 'forfeit-remaining' })
    const keep = await makeFixture(club, organizer, { fighters: THREE, poolSize: 3, ruleSetId: rules })
    const keepPools = await drawPools(keep)
    await fenceMatch(keep, matchBetween(keepPools, X, Z), X, 3)
    expect((await organizer.post(`${keep.base}/entries/${keep.entries.get(Z)}/withdraw`, { reason: 'Left after an injury' })).status).toBe(200)
    const kept = (await standings(keep)).pools[0]
    expect(kept.rows.find((r: Row) => r.fighter.name === X)).toMatchObject({ boutsFought: 3, unharmed: 3, wins: 1 })
    expect(kept.rows.find((r: Row) => r.fighter.name === Y)).toMatchObject({ wins: 1, forfeitWins: 1, boutsFought: 0 })
    expect(kept.rows[2]).toMatchObject({ fighter: { name: Z }, status: 'withdrawn' })
  })
})

describe('finals', () => {
  it('builds a bracket of the top four (1 v 4, 2 v 3, bronze), and the semifinals fill the final and the bronze match', async () => {
    // Everyone wins every bout against those listed after them: unharmed bouts 9, 6, 3, 0.
    const f = await makeFixture(club, organizer, { fighters: FOUR, poolSize: 4, qualifyCount: 4 })
    const pools = await drawPools(f)
    const ranked = [X, Y, Z, W]
    const pairs = ranked.flatMap((a, i) => ranked.slice(i + 1).map(b => [a, b] as const))
    for (const [a, b] of pairs.slice(0, -1)) await fenceMatch(f, matchBetween(pools, a, b), a, 3)

    const before = await tableCounts()
    const early = await organizer.post(`${f.base}/phase`, { to: 'finals' })
    expect(early.status).toBe(409)
    expect(early.data.data.fields.to).toBe('1 pool match is still to be fenced or settled before the finals')
    expect(await tableCounts()).toEqual(before)

    await fenceMatch(f, matchBetween(pools, Z, W), Z, 3)
    const finals = await organizer.post(`${f.base}/phase`, { to: 'finals' })
    expect(finals.status).toBe(200)
    expect(finals.data.phase).toBe('finals')

    const entry = (name: string) => f.entries.get(name)!
    const read = async () => (await (await as(club, 'scorekeeper')).get(`${f.base}/bracket`)).data
    const first = await read()
    const bracketMatch = (key: string) => first.bracket.matches.find((m: { id: string }) => m.id === key)
    expect(first.format).toBe('bracket')
    expect(first.bracket).toMatchObject({ fieldSize: 4, size: 4, roundCount: 2, bronze: true })
    expect(bracketMatch('r1m1').sides.map((s: { fighterId: number, seed: number }) => [s.seed, s.fighterId])).toEqual([[1, entry(X)], [4, entry(W)]])
    expect(bracketMatch('r1m2').sides.map((s: { fighterId: number, seed: number }) => [s.seed, s.fighterId])).toEqual([[2, entry(Y)], [3, entry(Z)]])
    expect(first.matches.map((m: MatchView) => [m.bracketKey, m.sideA?.name ?? null, m.sideB?.name ?? null, m.status])).toEqual([
      ['r1m1', X, W, 'scheduled'],
      ['r1m2', Y, Z, 'scheduled'],
      ['bronze', null, null, 'scheduled'],
      ['r2m1', null, null, 'scheduled'],
    ])

    const byKey = (data: { matches: MatchView[] }, key: string) => data.matches.find(m => m.bracketKey === key)!
    // The final is not ready yet; pool matches are over.
    expect((await record(organizer, f.base, byKey(first, 'r2m1').id, [clean('a')], 0)).status).toBe(409)
    expect((await record(organizer, f.base, pools[0]!.matches[0]!.id, [clean('a')])).status).toBe(409)

    await fenceMatch(f, byKey(first, 'r1m1'), X, 3)
    // An upset: seed 3 beats seed 2, two bouts to one (torso 2 + 2 against 2).
    await fenceMatch(f, byKey(first, 'r1m2'), Z, 2)
    const second = await read()
    expect(second.matches.map((m: MatchView) => [m.bracketKey, m.sideA?.name ?? null, m.sideB?.name ?? null, m.status])).toEqual([
      ['r1m1', X, W, 'finished'],
      ['r1m2', Y, Z, 'finished'],
      ['bronze', W, Y, 'scheduled'],
      ['r2m1', X, Z, 'scheduled'],
    ])
    expect(second.bracket.matches.find((m: { id: string }) => m.id === 'r2m1').status).toBe('ready')

    await fenceMatch(f, byKey(second, 'bronze'), Y, 3)
    await fenceMatch(f, byKey(second, 'r2m1'), X, 2)
    const done = await read()
    expect(done.places).toEqual({ first: entry(X), second: entry(Z), third: [entry(Y)], fourth: entry(W) })

    // The club site shows it all once the event is published.
    const anon = new Client()
    const publicPath = `/api/public/events/${club.slug}/${f.eventSlug}/tournaments/${f.tournamentId}`
    expect((await anon.get(publicPath)).status).toBe(404)
    expect((await organizer.post(`/api/clubs/${club.id}/events/${f.eventId}/publish`)).status).toBe(200)
    const site = await anon.get(publicPath)
    expect(site.status).toBe(200)
    expect(site.data.finals.format).toBe('bracket')
    expect(site.data.finals.places).toEqual(done.places)
    expect(site.data.finals.matches.map((m: MatchView) => m.winner)).toHaveLength(4)
    expect(site.data.standings.overall.rows.map((r: Row) => [r.fighter.name, r.survivalRate])).toEqual([[X, 1], [Y, 6 / 9], [Z, 3 / 9], [W, 0]])
  })
})

describe('a level final', () => {
  it('leaves the bracket waiting after a drawn final until the director settles it by forfeit', async () => {
    const f = await makeFixture(club, organizer, { fighters: THREE, poolSize: 3, qualifyCount: 2 })
    const pools = await drawPools(f)
    await fenceMatch(f, matchBetween(pools, X, Y), X, 3)
    await fenceMatch(f, matchBetween(pools, X, Z), X, 3)
    await fenceMatch(f, matchBetween(pools, Y, Z), Y, 3)
    expect((await organizer.post(`${f.base}/phase`, { to: 'finals' })).status).toBe(200)
    const bracket = (await organizer.get(`${f.base}/bracket`)).data
    expect(bracket.bracket).toMatchObject({ fieldSize: 2, bronze: false })
    const final = bracket.matches[0] as MatchView
    expect([final.bracketKey, final.sideA?.name, final.sideB?.name]).toEqual(['r1m1', X, Y])

    // Torso against torso and a double that scores nothing: 2–2 after three bouts.
    await fence(f, final, [[X, 'torso'], [Y, 'torso'], 'double'])
    const level = (await organizer.get(`${f.base}/bracket`)).data
    expect(level.matches[0]).toMatchObject({ status: 'finished', winner: 'draw' })
    expect(level.places.first).toBeNull()

    const settled = await organizer.post(`${f.base}/matches/${final.id}/forfeit`, { side: sideOf(final, Y), reason: 'Director\'s decision after review' })
    expect(settled.status).toBe(200)
    expect(settled.data.match).toMatchObject({ status: 'forfeit', winner: sideOf(final, X) })
    expect((await organizer.get(`${f.base}/bracket`)).data.places).toMatchObject({ first: f.entries.get(X), second: f.entries.get(Y) })
  })
})

describe('the club site', () => {
  it('shows a tournament of a published event only: pools, tables with survival rates, no e-mails', async () => {
    const f = await makeFixture(club, organizer, { fighters: THREE, poolSize: 3 })
    const pools: PoolView[] = await drawPools(f)
    await fenceMatch(f, matchBetween(pools, X, Y), X, 2)
    const fighterId = pools[0]!.fighters.find(p => p.name === X)!.fighterId
    expect((await organizer.patch(`/api/clubs/${club.id}/fighters/${fighterId}`, { email: 'hedda@ironquay.example' })).status).toBe(200)
    const anon = new Client()
    const path = `/api/public/events/${club.slug}/${f.eventSlug}/tournaments/${f.tournamentId}`
    expect((await anon.get(path)).status).toBe(404)

    expect((await organizer.post(`/api/clubs/${club.id}/events/${f.eventId}/publish`)).status).toBe(200)
    const res = await anon.get(path)
    expect(res.status).toBe(200)
    expect(res.data.tournament).toEqual({ id: f.tournamentId, name: 'Sword and buckler', weapon: 'sword and buckler', phase: 'pools' })
    expect(res.data.pools[0].fighters.map((p: { name: string }) => p.name).sort()).toEqual([X, Y, Z].sort())
    expect(Object.keys(res.data.pools[0].fighters[0]).sort()).toEqual(['clubName', 'entryId', 'name', 'position', 'status'])
    const x = res.data.standings.pools[0].rows.find((r: Row) => r.fighter.name === X)
    expect(x).toMatchObject({ unharmed: 2, boutsFought: 3 })
    expect(x.survivalRate).toBeCloseTo(2 / 3, 10)
    expect(res.data.finals).toBeNull()
    expect(JSON.stringify(res.data)).not.toContain('@')
    // The event's page beside it still answers.
    expect((await anon.get(`/api/public/events/${club.slug}/${f.eventSlug}`)).status).toBe(200)

    expect((await anon.get(`/api/public/events/${club.slug}/${f.eventSlug}/tournaments/2147483000`)).status).toBe(404)
    expect((await anon.get(`/api/public/events/${club.slug}/${f.eventSlug}/tournaments/abc`)).status).toBe(400)
    expect((await organizer.post(`/api/clubs/${club.id}/events/${f.eventId}/unpublish`)).status).toBe(200)
    expect((await anon.get(path)).status).toBe(404)
  })
})
