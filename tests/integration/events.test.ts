import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import type { TestClub } from '../support/fixtures'
import { makeClub, PASSWORD, pool, tableCounts } from '../support/fixtures'

let club: TestClub
let other: TestClub
let organizer: Client
let ruleSetId: number
const as = (c: TestClub, role: keyof TestClub['members']) => new Client().signIn(c.members[role].email, PASSWORD)
const events = (c: TestClub = club) => `/api/clubs/${c.id}/events`

// A complete rule set in the engine's shape, taken from the preset the server offers.
let firstHit: Record<string, unknown>
let slugCount = 0

function harvestOpen(over: Record<string, unknown> = {}) {
  slugCount += 1
  return {
    name: 'Wrenmouth Harvest Open', slug: `harvest-open-${slugCount}`, startsOn: '2026-09-12', endsOn: '2026-09-12',
    venue: 'Old Net Loft, Wrenmouth', rings: 3, emergencyNumber: '112', firstAidPoint: 'Beside ring 1, by the main door',
    ...over,
  }
}

async function makeEvent(over: Record<string, unknown> = {}) {
  const res = await organizer.post(events(), harvestOpen(over))
  expect(res.status).toBe(201)
  return res.data as { id: number, slug: string }
}

async function makeTournament(eventId: number, over: Record<string, unknown> = {}) {
  const res = await organizer.post(`${events()}/${eventId}/tournaments`, {
    name: 'Sword and buckler', weapon: 'sword and buckler', ruleSetId, ...over,
  })
  expect(res.status).toBe(201)
  return res.data as { id: number, qualifyCount: number }
}

/** Enters and checks in invented fighters through the API. */
async function checkIn(eventId: number, tournamentId: number, names: string[]) {
  const entries = `${events()}/${eventId}/tournaments/${tournamentId}/entries`
  for (const name of names) {
    const fighter = await organizer.post(`/api/clubs/${club.id}/fighters`, { name, clubName: 'Ironquay Fencing Hall' })
    const fighterId = fighter.status === 201
      ? fighter.data.id
      : (await organizer.get(`/api/clubs/${club.id}/fighters?q=${encodeURIComponent(name)}`)).data.fighters[0].id
    const entry = await organizer.post(entries, { fighterId })
    expect(entry.status).toBe(201)
    const done = await organizer.post(`${entries}/${entry.data.id}/check-in`, { kitChecked: true, weaponChecked: true })
    expect(done.status).toBe(200)
  }
}

beforeAll(async () => {
  club = await makeClub('events')
  other = await makeClub('events-other')
  organizer = await as(club, 'organizer')
  const presets = await organizer.get(`/api/clubs/${club.id}/rule-sets/presets`)
  firstHit = presets.data.presets.find((p: { name: string }) => p.name === 'first-hit-three-bouts').settings
  const rules = await organizer.post(`/api/clubs/${club.id}/rule-sets`, { name: 'Harvest first-hit', settings: firstHit })
  ruleSetId = rules.data.id
})
afterAll(() => pool.end())

describe('events', () => {
  it('lets an organizer create an event with its safety details, unpublished', async () => {
    const res = await organizer.post(events(), harvestOpen({ name: '  Wrenmouth   Harvest Open ' }))
    expect(res.status).toBe(201)
    expect(res.data).toMatchObject({ name: 'Wrenmouth Harvest Open', rings: 3, published: false, emergencyNumber: '112', tournaments: [] })
    const read = await (await as(club, 'scorekeeper')).get(`${events()}/${res.data.id}`)
    expect(read.status).toBe(200)
    expect(read.data.firstAidPoint).toBe('Beside ring 1, by the main door')
  })

  it('names the bad field: dates, date order, rings, slug', async () => {
    const badDate = await organizer.post(events(), harvestOpen({ startsOn: '2026-02-30' }))
    expect(badDate.status).toBe(400)
    expect(badDate.data.data.fields.startsOn).toBe('Enter the first day as YYYY-MM-DD')
    const typo = await organizer.post(events(), harvestOpen({ startsOn: '0226-09-12' }))
    expect(typo.data.data.fields.startsOn).toBe('Use a date between 1900 and 2999')
    const order = await organizer.post(events(), harvestOpen({ endsOn: '2026-09-11' }))
    expect(order.status).toBe(400)
    expect(order.data.data.fields.endsOn).toBe('The last day cannot be before the first day')
    const rings = await organizer.post(events(), harvestOpen({ rings: 9 }))
    expect(rings.status).toBe(400)
    expect(rings.data.data.fields.rings).toBe('At most 8 rings')
    const noRings = await organizer.post(events(), harvestOpen({ rings: 0 }))
    expect(noRings.data.data.fields.rings).toBe('At least one ring')
    const slug = await organizer.post(events(), harvestOpen({ slug: 'Harvest Open!' }))
    expect(slug.status).toBe(400)
    expect(slug.data.data.fields).toHaveProperty('slug')
  })

  it('refuses an address the club already uses for another event (409 on slug), but another club may use it', async () => {
    const first = await makeEvent()
    const again = await organizer.post(events(), harvestOpen({ slug: first.slug }))
    expect(again.status).toBe(409)
    expect(again.data.data.fields.slug).toMatch(/already uses/)
    const elsewhere = await (await as(other, 'organizer')).post(events(other), harvestOpen({ slug: first.slug }))
    expect(elsewhere.status).toBe(201)
  })

  it('changes some fields and checks the date order against the stored event', async () => {
    const event = await makeEvent({ startsOn: '2026-09-12', endsOn: '2026-09-13' })
    const moved = await organizer.patch(`${events()}/${event.id}`, { venue: 'Harbour Drill Hall', rings: 2 })
    expect(moved.status).toBe(200)
    expect(moved.data).toMatchObject({ venue: 'Harbour Drill Hall', rings: 2, endsOn: '2026-09-13' })
    const early = await organizer.patch(`${events()}/${event.id}`, { endsOn: '2026-09-01' })
    expect(early.status).toBe(400)
    expect(early.data.data.fields.endsOn).toMatch(/cannot be before/)
    const empty = await organizer.patch(`${events()}/${event.id}`, {})
    expect(empty.status).toBe(400)
  })

  it('lists the club\'s events with their tournaments for every member', async () => {
    const event = await makeEvent()
    await makeTournament(event.id)
    const res = await (await as(club, 'editor')).get(events())
    expect(res.status).toBe(200)
    const listed = res.data.events.find((e: { id: number }) => e.id === event.id)
    expect(listed.tournaments).toHaveLength(1)
    expect(listed.tournaments[0].entries).toEqual({ entered: 0, checkedIn: 0, withdrawn: 0 })
  })

  it('refuses every change to members without the organizer role (403), admin included', async () => {
    const event = await makeEvent()
    const before = await tableCounts()
    for (const role of ['admin', 'scorekeeper', 'streamer', 'commentator', 'editor'] as const) {
      const member = await as(club, role)
      const attempts = [
        await member.post(events(), harvestOpen()),
        await member.patch(`${events()}/${event.id}`, { name: 'Renamed' }),
        await member.delete(`${events()}/${event.id}`),
        await member.post(`${events()}/${event.id}/publish`),
        await member.post(`${events()}/${event.id}/tournaments`, { name: 'Rapier', weapon: 'rapier', ruleSetId }),
      ]
      expect(attempts.map(r => r.status), role).toEqual([403, 403, 403, 403, 403])
    }
    expect(await tableCounts()).toEqual(before)
  })

  it('hides events from another club (404) and from anonymous callers (401)', async () => {
    const event = await makeEvent()
    const outsider = await as(other, 'organizer')
    const before = await tableCounts()
    const attempts = [
      await outsider.get(events()),
      await outsider.get(`${events()}/${event.id}`),
      await outsider.patch(`${events()}/${event.id}`, { name: 'Taken over' }),
      await outsider.delete(`${events()}/${event.id}`),
      await outsider.post(`${events()}/${event.id}/publish`),
      await outsider.get(`${events(other)}/${event.id}`),
    ]
    expect(attempts.map(r => r.status)).toEqual([404, 404, 404, 404, 404, 404])
    const anon = new Client()
    expect((await anon.get(events())).status).toBe(401)
    expect((await anon.post(events(), harvestOpen())).status).toBe(401)
    expect(await tableCounts()).toEqual(before)
  })

  it('deletes an event whose tournaments are all still taking entries, with them', async () => {
    const event = await makeEvent()
    const tournament = await makeTournament(event.id)
    expect((await organizer.delete(`${events()}/${event.id}`)).status).toBe(204)
    expect((await organizer.get(`${events()}/${event.id}`)).status).toBe(404)
    const { rows } = await pool.query('select count(*)::int as n from tournaments where id = $1', [tournament.id])
    expect(rows[0].n).toBe(0)
  })

  it('refuses to delete an event once a tournament left the entries phase (409)', async () => {
    const event = await makeEvent()
    const tournament = await makeTournament(event.id)
    await checkIn(event.id, tournament.id, ['Mara Quillon', 'Tobin Ashgrove'])
    expect((await organizer.post(`${events()}/${event.id}/tournaments/${tournament.id}/phase`, { to: 'pools' })).status).toBe(200)
    const res = await organizer.delete(`${events()}/${event.id}`)
    expect(res.status).toBe(409)
    expect(res.data.message).toMatch(/already started/)
    expect((await organizer.get(`${events()}/${event.id}`)).status).toBe(200)
  })
})

describe('tournaments', () => {
  it('chooses the rule set\'s current version unless a version is named', async () => {
    const rules = await organizer.post(`/api/clubs/${club.id}/rule-sets`, { name: 'Two versions', settings: firstHit })
    await organizer.patch(`/api/clubs/${club.id}/rule-sets/${rules.data.id}`, { settings: { ...firstHit, boutsPerMatch: 1 } })
    const event = await makeEvent()
    const current = await makeTournament(event.id, { ruleSetId: rules.data.id })
    expect((await organizer.get(`${events()}/${event.id}/tournaments/${current.id}`)).data.ruleSet)
      .toEqual({ id: rules.data.id, name: 'Two versions', version: 2 })
    expect((await organizer.get(`${events()}/${event.id}/tournaments/${current.id}`)).data.qualifyCount).toBe(4)
    const older = await makeTournament(event.id, { name: 'Older rules', ruleSetId: rules.data.id, ruleSetVersion: 1 })
    expect((await organizer.get(`${events()}/${event.id}/tournaments/${older.id}`)).data.ruleSet.version).toBe(1)
    const missing = await organizer.post(`${events()}/${event.id}/tournaments`, { name: 'Future', weapon: 'longsword', ruleSetId: rules.data.id, ruleSetVersion: 3 })
    expect(missing.status).toBe(400)
    expect(missing.data.data.fields.ruleSetVersion).toMatch(/has versions 1 to 2/)
  })

  it('takes the number that reach the finals from the rule set unless the organizer sets it', async () => {
    const rules = await organizer.post(`/api/clubs/${club.id}/rule-sets`, {
      name: 'Top eight', settings: { ...firstHit, qualification: { topN: 8, minSurvivalRate: null } },
    })
    const event = await makeEvent()
    const byRules = await makeTournament(event.id, { name: 'By the rules', ruleSetId: rules.data.id })
    expect(byRules.qualifyCount).toBe(8)
    const chosen = await makeTournament(event.id, { name: 'Chosen', ruleSetId: rules.data.id, qualifyCount: 6 })
    expect(chosen.qualifyCount).toBe(6)
  })

  it('refuses a rule set of another club, a repeated name and bad sizes, naming the field', async () => {
    const event = await makeEvent()
    const foreign = await (await as(other, 'organizer')).post(`/api/clubs/${other.id}/rule-sets`, { name: 'Theirs', settings: firstHit })
    const stolen = await organizer.post(`${events()}/${event.id}/tournaments`, { name: 'Longsword', weapon: 'longsword', ruleSetId: foreign.data.id })
    expect(stolen.status).toBe(400)
    expect(stolen.data.data.fields.ruleSetId).toMatch(/No rule set/)
    await makeTournament(event.id, { name: 'Longsword open' })
    const twice = await organizer.post(`${events()}/${event.id}/tournaments`, { name: 'longsword OPEN', weapon: 'longsword', ruleSetId })
    expect(twice.status).toBe(409)
    expect(twice.data.data.fields.name).toMatch(/already has a tournament/)
    const sizes = await organizer.post(`${events()}/${event.id}/tournaments`, { name: 'Messer', weapon: 'messer', ruleSetId, poolSize: 2, qualifyCount: 1.5 })
    expect(sizes.status).toBe(400)
    expect(Object.keys(sizes.data.data.fields).sort()).toEqual(['poolSize', 'qualifyCount'])
    const noWeapon = await organizer.post(`${events()}/${event.id}/tournaments`, { name: 'Sabre', weapon: '  ', ruleSetId })
    expect(noWeapon.data.data.fields.weapon).toMatch(/Enter the weapon/)
  })

  it('edits a tournament and deletes one that is still taking entries', async () => {
    const event = await makeEvent()
    const tournament = await makeTournament(event.id)
    const path = `${events()}/${event.id}/tournaments/${tournament.id}`
    const edited = await organizer.patch(path, { poolSize: 6, qualifyCount: 8, name: 'Open sword and buckler' })
    expect(edited.status).toBe(200)
    expect(edited.data).toMatchObject({ poolSize: 6, qualifyCount: 8, name: 'Open sword and buckler', phase: 'entries' })
    expect((await organizer.delete(path)).status).toBe(204)
    expect((await organizer.get(path)).status).toBe(404)
  })

  it('does not find a tournament through another event of the same club', async () => {
    const a = await makeEvent()
    const b = await makeEvent()
    const tournament = await makeTournament(a.id)
    expect((await organizer.get(`${events()}/${b.id}/tournaments/${tournament.id}`)).status).toBe(404)
  })
})

describe('phases', () => {
  it('moves forward one step at a time: entries, pools, finals, done', async () => {
    const event = await makeEvent()
    const tournament = await makeTournament(event.id)
    const phase = (to: string) => organizer.post(`${events()}/${event.id}/tournaments/${tournament.id}/phase`, { to })
    const skip = await phase('finals')
    expect(skip.status).toBe(409)
    expect(skip.data.data.fields.to).toMatch(/the only next phase is “pools”/)
    await checkIn(event.id, tournament.id, ['Ysolde Markham', 'Corin Fallowby', 'Edda Thrane'])
    const pools = await phase('pools')
    expect(pools.status).toBe(200)
    expect(pools.data).toMatchObject({ phase: 'pools', nextPhase: 'finals' })
    expect((await phase('pools')).status).toBe(409)
    expect((await phase('entries')).status).toBe(409)
    expect((await phase('finals')).data.phase).toBe('finals')
    const done = await phase('done')
    expect(done.data).toMatchObject({ phase: 'done', nextPhase: null })
    const after = await phase('done')
    expect(after.status).toBe(409)
    expect(after.data.data.fields.to).toMatch(/done/)
  })

  it('names the field for an unknown phase', async () => {
    const event = await makeEvent()
    const tournament = await makeTournament(event.id)
    const res = await organizer.post(`${events()}/${event.id}/tournaments/${tournament.id}/phase`, { to: 'semifinals' })
    expect(res.status).toBe(400)
    expect(res.data.data.fields.to).toBe('Use one of: entries, pools, finals, done')
  })

  it('needs at least two checked-in fighters to start the pools', async () => {
    const event = await makeEvent()
    const tournament = await makeTournament(event.id)
    await checkIn(event.id, tournament.id, ['Wynn Harrowgate'])
    // Entered but not checked in: does not count.
    const fighter = await organizer.post(`/api/clubs/${club.id}/fighters`, { name: 'Alder Crane', clubName: 'Old Mill Fencing School' })
    await organizer.post(`${events()}/${event.id}/tournaments/${tournament.id}/entries`, { fighterId: fighter.data.id })
    const res = await organizer.post(`${events()}/${event.id}/tournaments/${tournament.id}/phase`, { to: 'pools' })
    expect(res.status).toBe(409)
    expect(res.data.data.fields.to).toMatch(/at least 2 checked-in fighters; 1 checked in/)
    expect((await organizer.get(`${events()}/${event.id}/tournaments/${tournament.id}`)).data.frozenRules).toBeNull()
  })

  it('leaves the phase to the organizer (403 for the scorekeeper)', async () => {
    const event = await makeEvent()
    const tournament = await makeTournament(event.id)
    const res = await (await as(club, 'scorekeeper')).post(`${events()}/${event.id}/tournaments/${tournament.id}/phase`, { to: 'pools' })
    expect(res.status).toBe(403)
  })
})

describe('frozen rules', () => {
  it('freezes the chosen version when the pools start; later rule-set edits never change it', async () => {
    const rules = await organizer.post(`/api/clubs/${club.id}/rule-sets`, { name: 'To be frozen', settings: firstHit })
    const event = await makeEvent()
    const tournament = await makeTournament(event.id, { ruleSetId: rules.data.id })
    const path = `${events()}/${event.id}/tournaments/${tournament.id}`
    expect((await organizer.get(path)).data.frozenRules).toBeNull()
    await checkIn(event.id, tournament.id, ['Piet Varrow', 'Sela Dunmore'])
    const started = await organizer.post(`${path}/phase`, { to: 'pools' })
    const version1 = { ...firstHit, name: 'To be frozen', version: 1 }
    expect(started.data.frozenRules).toEqual(version1)

    const edited = await organizer.patch(`/api/clubs/${club.id}/rule-sets/${rules.data.id}`, {
      name: 'Frozen no more', settings: { ...firstHit, doubleOutLimit: 1, afterblow: { scoring: 'difference' } },
    })
    expect(edited.data.currentVersion).toBe(2)
    const after = await organizer.get(path)
    expect(after.data.frozenRules).toEqual(version1)
    expect(after.data.ruleSet.version).toBe(1)
    const { rows } = await pool.query('select frozen_rules from tournaments where id = $1', [tournament.id])
    expect(rows[0].frozen_rules).toEqual(version1)
  })

  it('refuses to change the rule set or pool size once the pools have started (409)', async () => {
    const event = await makeEvent()
    const tournament = await makeTournament(event.id)
    const path = `${events()}/${event.id}/tournaments/${tournament.id}`
    await checkIn(event.id, tournament.id, ['Hale Brannock', 'Orla Penhallow'])
    await organizer.post(`${path}/phase`, { to: 'pools' })
    expect((await organizer.patch(path, { ruleSetVersion: 1 })).status).toBe(409)
    expect((await organizer.patch(path, { poolSize: 4 })).status).toBe(409)
    expect((await organizer.delete(path)).status).toBe(409)
    expect((await organizer.patch(path, { name: 'Sword and buckler open' })).status).toBe(200)
  })
})

describe('publishing and the public page', () => {
  it('will not publish without the emergency number and first-aid point of the safety notice', async () => {
    const event = await makeEvent({ emergencyNumber: '', firstAidPoint: '' })
    const noNumber = await organizer.post(`${events()}/${event.id}/publish`)
    expect(noNumber.status).toBe(400)
    expect(noNumber.data.data.fields).toHaveProperty('emergencyNumber')
    await organizer.patch(`${events()}/${event.id}`, { emergencyNumber: '112' })
    const noFirstAid = await organizer.post(`${events()}/${event.id}/publish`)
    expect(noFirstAid.data.data.fields).toHaveProperty('firstAidPoint')
    await organizer.patch(`${events()}/${event.id}`, { firstAidPoint: 'Club room behind ring 2' })
    expect((await organizer.post(`${events()}/${event.id}/publish`)).data.published).toBe(true)
    const cleared = await organizer.patch(`${events()}/${event.id}`, { emergencyNumber: '' })
    expect(cleared.status).toBe(400)
    expect(cleared.data.data.fields.emergencyNumber).toMatch(/unpublish it first/)
  })

  it('shows a published event with its tournaments, phases and entry counts to anyone, without private data', async () => {
    const event = await makeEvent()
    const tournament = await makeTournament(event.id)
    await checkIn(event.id, tournament.id, ['Bryn Calloway', 'Nell Saltire'])
    await organizer.patch(`/api/clubs/${club.id}/fighters/${(await organizer.get(`/api/clubs/${club.id}/fighters?q=Bryn`)).data.fighters[0].id}`, { email: 'bryn@ironquay.example' })
    const anon = new Client()
    const path = `/api/public/events/${club.slug}/${event.slug}`
    expect((await anon.get(path)).status).toBe(404)

    expect((await organizer.post(`${events()}/${event.id}/publish`)).status).toBe(200)
    const res = await anon.get(path)
    expect(res.status).toBe(200)
    expect(res.data.event).toMatchObject({ name: 'Wrenmouth Harvest Open', slug: event.slug, rings: 3, safety: { emergencyNumber: '112' } })
    expect(res.data.tournaments).toEqual([{ id: tournament.id, name: 'Sword and buckler', weapon: 'sword and buckler', phase: 'entries', entries: 2 }])
    expect(JSON.stringify(res.data)).not.toContain('@')
    expect(res.data.event).not.toHaveProperty('id')
    const list = await anon.get(`/api/public/events/${club.slug}`)
    expect(list.data.events.map((e: { slug: string }) => e.slug)).toContain(event.slug)

    expect((await organizer.post(`${events()}/${event.id}/unpublish`)).data.published).toBe(false)
    expect((await anon.get(path)).status).toBe(404)
    expect((await anon.get(`/api/public/events/${club.slug}`)).data.events.map((e: { slug: string }) => e.slug)).not.toContain(event.slug)
  })

  it('answers 404 for an unknown club or event and 400 for a malformed address', async () => {
    const anon = new Client()
    expect((await anon.get('/api/public/events/no-such-club/harvest-open-1')).status).toBe(404)
    expect((await anon.get(`/api/public/events/${club.slug}/no-such-event`)).status).toBe(404)
    expect((await anon.get(`/api/public/events/${club.slug}/Bad%20Slug`)).status).toBe(400)
  })
})
