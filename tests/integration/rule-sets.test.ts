import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import type { TestClub } from '../support/fixtures'
import { makeClub, PASSWORD, pool, tableCounts } from '../support/fixtures'

let club: TestClub
let other: TestClub
let organizer: Client
const as = (c: TestClub, role: keyof TestClub['members']) => new Client().signIn(c.members[role].email, PASSWORD)
const ruleSets = (c: TestClub = club) => `/api/clubs/${c.id}/rule-sets`

// A complete rule set in the engine's shape, taken from the preset the server offers.
let survival: Record<string, unknown>

beforeAll(async () => {
  club = await makeClub('rules')
  other = await makeClub('rules-other')
  organizer = await as(club, 'organizer')
  const presets = await organizer.get(`${ruleSets()}/presets`)
  survival = { ...presets.data.presets.find((p: { name: string }) => p.name === 'first-hit-three-bouts').settings, boutsPerMatch: 2 }
})
afterAll(() => pool.end())

describe('creating rule sets', () => {
  it('lets an organizer start a rule set from a preset, as version 1', async () => {
    const presets = await organizer.get(`${ruleSets()}/presets`)
    expect(presets.status).toBe(200)
    const preset = presets.data.presets[0]
    const res = await organizer.post(ruleSets(), { name: 'Harvest Open sword and buckler', preset: preset.name })
    expect(res.status).toBe(201)
    expect(res.data.currentVersion).toBe(1)
    // The server writes the rule set's own name and version into the settings.
    expect(res.data.settings).toEqual({ ...preset.settings, name: 'Harvest Open sword and buckler', version: 1 })
    expect(res.data.versions).toHaveLength(1)
    expect(res.data.versions[0].createdBy).toBe(club.members.organizer.id)
  })

  it('accepts full settings instead of a preset', async () => {
    const res = await organizer.post(ruleSets(), { name: 'Club night survival', settings: { ...survival, version: 77 } })
    expect(res.status).toBe(201)
    expect(res.data.settings).toEqual({ ...survival, name: 'Club night survival', version: 1 })
  })

  it('names the field for a missing name, no settings, an unknown preset or settings that are not an object', async () => {
    const noName = await organizer.post(ruleSets(), { preset: 'first-hit-three-bouts' })
    expect(noName.status).toBe(400)
    expect(noName.data.data.fields).toHaveProperty('name')
    const nothing = await organizer.post(ruleSets(), { name: 'Empty' })
    expect(nothing.status).toBe(400)
    expect(nothing.data.data.fields.settings).toBe('Choose a preset or send the settings')
    const unknown = await organizer.post(ruleSets(), { name: 'Odd', preset: 'no-such-preset' })
    expect(unknown.status).toBe(400)
    expect(unknown.data.data.fields.preset).toMatch(/Unknown preset/)
    const list = await organizer.post(ruleSets(), { name: 'Odd', settings: [1, 2] })
    expect(list.status).toBe(400)
    expect(list.data.data.fields).toHaveProperty('settings')
    const both = await organizer.post(ruleSets(), { name: 'Odd', preset: 'first-hit-three-bouts', settings: survival })
    expect(both.status).toBe(400)
    expect(both.data.data.fields).toHaveProperty('preset')
    const extra = await organizer.post(ruleSets(), { name: 'Odd', settings: survival, clubId: other.id })
    expect(extra.status).toBe(400)
    expect(extra.data.message).toMatch(/Unknown field: clubId/)
  })

  it('checks the settings with the rule engine and names the setting', async () => {
    const res = await organizer.post(ruleSets(), { name: 'Broken', settings: { ...survival, boutsPerMatch: 0, withdrawn: 'vanish' } })
    expect(res.status).toBe(400)
    expect(res.data.data.fields['settings.boutsPerMatch']).toBe('use at least 1')
    expect(res.data.data.fields).toHaveProperty(['settings.withdrawn'])
    expect(res.data.message).toMatch(/^settings\.boutsPerMatch: use at least 1/)
  })

  it('refuses a second rule set with the same name, whatever its case (409 on name)', async () => {
    expect((await organizer.post(ruleSets(), { name: 'Longsword points', preset: 'points-to-seven' })).status).toBe(201)
    const res = await organizer.post(ruleSets(), { name: 'LONGSWORD  points', preset: 'points-to-seven' })
    expect(res.status).toBe(409)
    expect(res.data.data.fields.name).toMatch(/already has a rule set/)
  })
})

describe('who may see and change rule sets', () => {
  it('lets every member read them', async () => {
    for (const role of ['scorekeeper', 'streamer', 'commentator', 'editor', 'admin'] as const) {
      const res = await (await as(club, role)).get(ruleSets())
      expect(res.status, role).toBe(200)
      expect(res.data.ruleSets.length, role).toBeGreaterThan(0)
    }
  })

  it('refuses changes to members without the organizer role (403), admin included, and writes nothing', async () => {
    const created = await organizer.post(ruleSets(), { name: 'Guarded', settings: survival })
    const before = await tableCounts()
    for (const role of ['admin', 'scorekeeper', 'streamer', 'commentator', 'editor'] as const) {
      const member = await as(club, role)
      const attempts = [
        await member.post(ruleSets(), { name: `By ${role}`, settings: survival }),
        await member.patch(`${ruleSets()}/${created.data.id}`, { settings: survival }),
        await member.delete(`${ruleSets()}/${created.data.id}`),
      ]
      expect(attempts.map(r => r.status), role).toEqual([403, 403, 403])
      expect(attempts[0]!.data.message).toBe('This needs the Organizer role')
    }
    expect(await tableCounts()).toEqual(before)
  })

  it('hides them from another club (404) and from anonymous callers (401)', async () => {
    const created = await organizer.post(ruleSets(), { name: 'Private', settings: survival })
    const outsider = await as(other, 'organizer')
    const before = await tableCounts()
    const attempts = [
      await outsider.get(ruleSets()),
      await outsider.get(`${ruleSets()}/${created.data.id}`),
      await outsider.patch(`${ruleSets()}/${created.data.id}`, { name: 'Taken' }),
      await outsider.delete(`${ruleSets()}/${created.data.id}`),
    ]
    expect(attempts.map(r => r.status)).toEqual([404, 404, 404, 404])
    // The other club's own path does not reach this club's rule set either.
    expect((await outsider.get(`${ruleSets(other)}/${created.data.id}`)).status).toBe(404)
    const anon = new Client()
    expect((await anon.get(ruleSets())).status).toBe(401)
    expect((await anon.post(ruleSets(), { name: 'Anon', settings: survival })).status).toBe(401)
    expect(await tableCounts()).toEqual(before)
  })
})

describe('versions', () => {
  it('makes a new version for new settings and keeps the old one unchanged', async () => {
    const created = await organizer.post(ruleSets(), { name: 'Versioned', settings: survival })
    const path = `${ruleSets()}/${created.data.id}`
    const edited = await organizer.patch(path, { settings: { ...survival, boutsPerMatch: 5 } })
    expect(edited.status).toBe(200)
    expect(edited.data.currentVersion).toBe(2)
    expect(edited.data.settings).toMatchObject({ boutsPerMatch: 5, version: 2 })
    expect(edited.data.versions.map((v: { version: number }) => v.version)).toEqual([2, 1])
    const first = await organizer.get(`${path}/versions/1`)
    expect(first.status).toBe(200)
    expect(first.data.settings).toEqual({ ...survival, name: 'Versioned', version: 1 })
    expect((await organizer.get(`${path}/versions/3`)).status).toBe(404)
  })

  it('renames without a new version', async () => {
    const created = await organizer.post(ruleSets(), { name: 'Old name', settings: survival })
    const res = await organizer.patch(`${ruleSets()}/${created.data.id}`, { name: 'New name' })
    expect(res.status).toBe(200)
    expect(res.data.name).toBe('New name')
    expect(res.data.currentVersion).toBe(1)
  })

  it('asks for a change when the patch is empty', async () => {
    const created = await organizer.post(ruleSets(), { name: 'Unchanged', settings: survival })
    const res = await organizer.patch(`${ruleSets()}/${created.data.id}`, {})
    expect(res.status).toBe(400)
    expect(res.data.message).toMatch(/Send a new name or new settings/)
  })
})

describe('deleting rule sets', () => {
  it('deletes an unused rule set with its versions', async () => {
    const created = await organizer.post(ruleSets(), { name: 'Short-lived', settings: survival })
    expect((await organizer.patch(`${ruleSets()}/${created.data.id}`, { settings: { ...survival, boutsPerMatch: 1 } })).status).toBe(200)
    expect((await organizer.delete(`${ruleSets()}/${created.data.id}`)).status).toBe(204)
    expect((await organizer.get(`${ruleSets()}/${created.data.id}`)).status).toBe(404)
    const { rows } = await pool.query('select count(*)::int as n from rule_set_versions where rule_set_id = $1', [created.data.id])
    expect(rows[0].n).toBe(0)
  })

  it('refuses with 409 while a tournament uses it', async () => {
    const created = await organizer.post(ruleSets(), { name: 'In use', settings: survival })
    const event = await organizer.post(`/api/clubs/${club.id}/events`, {
      name: 'Rules Test Open', slug: 'rules-test-open', startsOn: '2026-09-12', endsOn: '2026-09-12',
    })
    const tournament = await organizer.post(`/api/clubs/${club.id}/events/${event.data.id}/tournaments`, {
      name: 'Longsword', weapon: 'longsword', ruleSetId: created.data.id,
    })
    expect(tournament.status).toBe(201)
    const res = await organizer.delete(`${ruleSets()}/${created.data.id}`)
    expect(res.status).toBe(409)
    expect(res.data.message).toMatch(/A tournament uses this rule set/)
    const detail = await organizer.get(`${ruleSets()}/${created.data.id}`)
    expect(detail.data.tournaments.map((t: { id: number }) => t.id)).toEqual([tournament.data.id])
  })
})
