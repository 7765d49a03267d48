import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BASE_URL, Client } from '../support/http'
import type { TestClub } from '../support/fixtures'
import { makeClub, PASSWORD, pool, tableCounts } from '../support/fixtures'

let club: TestClub
let other: TestClub
let organizer: Client
const as = (c: TestClub, role: keyof TestClub['members']) => new Client().signIn(c.members[role].email, PASSWORD)
const fighters = (c: TestClub = club) => `/api/clubs/${c.id}/fighters`

// A real 1×1 PNG, the same bytes as the logo test uses.
const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c489'
  + '0000000b49444154789c63f80f040009fb03fdfb5e6b2b0000000049454e44ae426082', 'hex')

function uploadPhoto(client: Client, fighterId: number, file: Blob, name: string) {
  const form = new FormData()
  form.append('photo', file, name)
  return client.request('POST', `${fighters()}/${fighterId}/photo`, { body: form })
}

async function makeFighter(name: string, clubName = 'North Downs Buckler Circle', email?: string) {
  const res = await organizer.post(fighters(), { name, clubName, email })
  expect(res.status).toBe(201)
  return res.data as { id: number, name: string }
}

beforeAll(async () => {
  club = await makeClub('fighters')
  other = await makeClub('fighters-other')
  organizer = await as(club, 'organizer')
})
afterAll(() => pool.end())

describe('the roster', () => {
  it('adds a fighter with tidied spacing and a lower-cased e-mail', async () => {
    const res = await organizer.post(fighters(), { name: '  Rowan   Estcourt ', clubName: 'Lanterngate Historical Fencing', email: ' Rowan@Lanterngate.Example ' })
    expect(res.status).toBe(201)
    expect(res.data).toMatchObject({ name: 'Rowan Estcourt', clubName: 'Lanterngate Historical Fencing', email: 'rowan@lanterngate.example', photoUrl: null })
  })

  it('refuses the same name and club twice, whatever the case and spacing (409 on name)', async () => {
    await makeFighter('Isolde Brackwater', 'Greyfield Sword Society')
    const res = await organizer.post(fighters(), { name: 'isolde  BRACKWATER', clubName: ' greyfield sword society' })
    expect(res.status).toBe(409)
    expect(res.data.data.fields.name).toMatch(/already has a fighter/)
    // The same name from another club is another person.
    expect((await organizer.post(fighters(), { name: 'Isolde Brackwater', clubName: 'Old Mill Fencing School' })).status).toBe(201)
  })

  it('names the bad fields', async () => {
    const res = await organizer.post(fighters(), { name: ' ', clubName: '', email: 'not-an-address' })
    expect(res.status).toBe(400)
    expect(Object.keys(res.data.data.fields).sort()).toEqual(['clubName', 'email', 'name'])
    expect(res.data.data.fields.email).toBe('Enter a valid e-mail address')
  })

  it('lists and searches the roster for every member', async () => {
    await makeFighter('Tamsin Oakridge', 'Ironquay Fencing Hall')
    const editor = await as(club, 'editor')
    const all = await editor.get(fighters())
    expect(all.status).toBe(200)
    expect(all.data.fighters.length).toBeGreaterThan(1)
    const found = await editor.get(`${fighters()}?q=oakr`)
    expect(found.data.fighters.map((f: { name: string }) => f.name)).toEqual(['Tamsin Oakridge'])
    const byClub = await editor.get(`${fighters()}?q=${encodeURIComponent('ironquay')}`)
    expect(byClub.data.fighters.map((f: { name: string }) => f.name)).toContain('Tamsin Oakridge')
    expect((await editor.get(`${fighters()}?q=100%25`)).data.fighters).toEqual([])
  })

  it('changes a fighter and clears the e-mail', async () => {
    const fighter = await makeFighter('Garrick Penwyth', 'Ironquay Fencing Hall', 'garrick@ironquay.example')
    const res = await organizer.patch(`${fighters()}/${fighter.id}`, { clubName: 'Saltmarsh Sword Guild', email: '' })
    expect(res.status).toBe(200)
    expect(res.data).toMatchObject({ name: 'Garrick Penwyth', clubName: 'Saltmarsh Sword Guild', email: null })
  })

  it('deletes a fighter without entries, and refuses one with entries (409)', async () => {
    const loose = await makeFighter('Hollis Vane')
    expect((await organizer.delete(`${fighters()}/${loose.id}`)).status).toBe(204)
    expect((await organizer.get(`${fighters()}/${loose.id}`)).status).toBe(404)

    const rules = await organizer.post(`/api/clubs/${club.id}/rule-sets`, { name: 'Roster rules', preset: 'first-hit-three-bouts' })
    const event = await organizer.post(`/api/clubs/${club.id}/events`, { name: 'Roster Cup', slug: 'roster-cup', startsOn: '2026-10-03', endsOn: '2026-10-03' })
    const tournament = await organizer.post(`/api/clubs/${club.id}/events/${event.data.id}/tournaments`, { name: 'Messer', weapon: 'messer', ruleSetId: rules.data.id })
    const entered = await makeFighter('Brannoc Teague')
    await organizer.post(`/api/clubs/${club.id}/events/${event.data.id}/tournaments/${tournament.data.id}/entries`, { fighterId: entered.id })
    const res = await organizer.delete(`${fighters()}/${entered.id}`)
    expect(res.status).toBe(409)
    const detail = await organizer.get(`${fighters()}/${entered.id}`)
    expect(detail.data.entries).toHaveLength(1)
    expect(detail.data.entries[0]).toMatchObject({ tournamentName: 'Messer', eventName: 'Roster Cup', status: 'entered' })
  })
})

describe('who may see and change the roster', () => {
  it('refuses changes to members without the organizer role (403), admin included', async () => {
    const fighter = await makeFighter('Leontyne Marsh')
    const before = await tableCounts()
    for (const role of ['admin', 'scorekeeper', 'streamer', 'commentator', 'editor'] as const) {
      const member = await as(club, role)
      const attempts = [
        await member.post(fighters(), { name: `Fighter of ${role}`, clubName: 'Greyfield Sword Society' }),
        await member.patch(`${fighters()}/${fighter.id}`, { name: 'Renamed' }),
        await member.delete(`${fighters()}/${fighter.id}`),
        await uploadPhoto(member, fighter.id, new Blob([png], { type: 'image/png' }), 'face.png'),
      ]
      expect(attempts.map(r => r.status), role).toEqual([403, 403, 403, 403])
    }
    expect(await tableCounts()).toEqual(before)
  })

  it('hides the roster and its e-mails from another club (404) and anonymous callers (401)', async () => {
    const fighter = await makeFighter('Perrin Ashdown', 'Ironquay Fencing Hall', 'perrin@ironquay.example')
    const outsider = await as(other, 'organizer')
    const attempts = [
      await outsider.get(fighters()),
      await outsider.get(`${fighters()}/${fighter.id}`),
      await outsider.patch(`${fighters()}/${fighter.id}`, { name: 'Taken' }),
      await outsider.delete(`${fighters()}/${fighter.id}`),
      await outsider.get(`${fighters(other)}/${fighter.id}`),
      await outsider.get(`${fighters()}/${fighter.id}/photo`),
    ]
    expect(attempts.map(r => r.status)).toEqual([404, 404, 404, 404, 404, 404])
    for (const r of attempts) expect(JSON.stringify(r.data)).not.toContain('perrin@')
    expect((await new Client().get(fighters())).status).toBe(401)
  })
})

describe('photos', () => {
  it('stores a photo in object storage and serves the same bytes to members', async () => {
    const fighter = await makeFighter('Saoirse Winterbourne')
    const res = await uploadPhoto(organizer, fighter.id, new Blob([png], { type: 'image/png' }), 'face.png')
    expect(res.status).toBe(200)
    expect(res.data.photoUrl).toMatch(new RegExp(`^/api/clubs/${club.id}/fighters/${fighter.id}/photo\\?v=[0-9a-f]{32}$`))
    const commentator = await as(club, 'commentator')
    const served = await fetch(new URL(res.data.photoUrl, BASE_URL), {
      headers: { cookie: [...commentator.cookies].map(([k, v]) => `${k}=${v}`).join('; ') },
    })
    expect(served.status).toBe(200)
    expect(served.headers.get('content-type')).toBe('image/png')
    expect(served.headers.get('cache-control')).toMatch(/private/)
    expect(Buffer.from(await served.arrayBuffer()).equals(png)).toBe(true)
    expect((await new Client().get(res.data.photoUrl)).status).toBe(401)
    expect((await organizer.delete(`${fighters()}/${fighter.id}/photo`)).status).toBe(204)
    expect((await organizer.get(`${fighters()}/${fighter.id}`)).data.photoUrl).toBeNull()
    expect((await organizer.get(res.data.photoUrl)).status).toBe(404)
  })

  it('checks the type from the content, not the name', async () => {
    const fighter = await makeFighter('Caddock Lorne')
    const res = await uploadPhoto(organizer, fighter.id, new Blob(['<svg xmlns="http://www.w3.org/2000/svg"/>'], { type: 'image/png' }), 'face.png')
    expect(res.status).toBe(400)
    expect(res.data.data.fields.photo).toBe('Use a PNG, JPEG or WebP image')
    const json = await organizer.post(`${fighters()}/${fighter.id}/photo`, { photo: 'x' })
    expect(json.status).toBe(415)
  })
})
