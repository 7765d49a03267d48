import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { GetObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { Client } from '../support/http'
import type { TestClub } from '../support/fixtures'
import { makeClub, PASSWORD, pool, tableCounts } from '../support/fixtures'

let club: TestClub
let other: TestClub
const as = (c: TestClub, role: keyof TestClub['members']) => new Client().signIn(c.members[role].email, PASSWORD)

beforeAll(async () => {
  club = await makeClub('clubs')
  other = await makeClub('other')
})
afterAll(() => pool.end())

const profile = (over: Record<string, unknown> = {}) => ({
  name: 'Saltmarsh Test Guild', slug: club.slug, town: 'Wrenmouth', about: 'Net loft, Tuesdays.',
  primaryColor: '#1f3a4d', secondaryColor: '#d9ad4f', ...over,
})

describe('club profile', () => {
  it('lets an admin change the profile and brand colours', async () => {
    const admin = await as(club, 'admin')
    const res = await admin.patch(`/api/clubs/${club.id}`, profile({ primaryColor: '#2B313B' }))
    expect(res.status).toBe(200)
    expect(res.data.primaryColor).toBe('#2b313b')
    expect((await new Client().get(`/api/public/clubs/${club.slug}`)).data.name).toBe('Saltmarsh Test Guild')
  })

  it('names the bad colour field', async () => {
    const admin = await as(club, 'admin')
    const res = await admin.patch(`/api/clubs/${club.id}`, profile({ secondaryColor: 'gold' }))
    expect(res.status).toBe(400)
    expect(Object.keys(res.data.data.fields)).toEqual(['secondaryColor'])
  })

  it('refuses an address another club uses with 409 on the slug field', async () => {
    const admin = await as(club, 'admin')
    const res = await admin.patch(`/api/clubs/${club.id}`, profile({ slug: other.slug }))
    expect(res.status).toBe(409)
    expect(res.data.data.fields.slug).toMatch(/already uses/)
  })

  it('refuses the profile to every role but admin (403)', async () => {
    for (const role of ['organizer', 'scorekeeper', 'streamer', 'commentator', 'editor'] as const) {
      const res = await (await as(club, role)).patch(`/api/clubs/${club.id}`, profile())
      expect(res.status, role).toBe(403)
    }
  })

  it('gives every member the club overview with their own roles', async () => {
    const res = await (await as(club, 'commentator')).get(`/api/clubs/${club.id}`)
    expect(res.status).toBe(200)
    expect(res.data.roles).toEqual(['commentator'])
    expect(res.data.memberCount).toBe(6)
  })
})

describe('another club', () => {
  it('sees none of this club: 404 for the overview, members, invitations and changes', async () => {
    const outsider = await as(other, 'admin')
    const before = await tableCounts()
    const attempts = [
      await outsider.get(`/api/clubs/${club.id}`),
      await outsider.get(`/api/clubs/${club.id}/members`),
      await outsider.patch(`/api/clubs/${club.id}`, profile({ name: 'Taken over' })),
      await outsider.patch(`/api/clubs/${club.id}/members/${club.members.editor.id}`, { roles: ['admin'] }),
      await outsider.delete(`/api/clubs/${club.id}/members/${club.members.editor.id}`),
      await outsider.post(`/api/clubs/${club.id}/invitations`, { email: 'spy@test.example', roles: ['admin'] }),
    ]
    expect(attempts.map(r => r.status)).toEqual([404, 404, 404, 404, 404, 404])
    for (const r of attempts) expect(JSON.stringify(r.data)).not.toContain(club.members.editor.email)
    expect(await tableCounts()).toEqual(before)
  })

  it('does not see this club in its account', async () => {
    const res = await (await as(other, 'admin')).get('/api/account')
    expect(res.data.clubs.map((c: { id: number }) => c.id)).toEqual([other.id])
  })
})

describe('members and roles', () => {
  it('lists members with roles for an admin only', async () => {
    const res = await (await as(club, 'admin')).get(`/api/clubs/${club.id}/members`)
    expect(res.status).toBe(200)
    expect(res.data.members).toHaveLength(6)
    expect((await (await as(club, 'scorekeeper')).get(`/api/clubs/${club.id}/members`)).status).toBe(403)
  })

  it('does not let a scorekeeper change roles (403) and changes nothing', async () => {
    const table = await as(club, 'scorekeeper')
    const before = await tableCounts()
    const res = await table.patch(`/api/clubs/${club.id}/members/${club.members.scorekeeper.id}`, { roles: ['admin', 'scorekeeper'] })
    expect(res.status).toBe(403)
    expect(res.data.message).toBe('This needs the Admin role')
    expect(await tableCounts()).toEqual(before)
    expect((await table.get(`/api/clubs/${club.id}`)).data.roles).toEqual(['scorekeeper'])
  })

  it('lets an admin give a member several roles, which take effect at once', async () => {
    const admin = await as(club, 'admin')
    const streamer = await as(club, 'streamer')
    const res = await admin.patch(`/api/clubs/${club.id}/members/${club.members.streamer.id}`, { roles: ['editor', 'streamer', 'editor'] })
    expect(res.status).toBe(200)
    expect(res.data.roles).toEqual(['streamer', 'editor'])
    expect((await streamer.get(`/api/clubs/${club.id}`)).data.roles).toEqual(['streamer', 'editor'])
  })

  it('refuses to leave the club without an admin (409)', async () => {
    const admin = await as(club, 'admin')
    const demote = await admin.patch(`/api/clubs/${club.id}/members/${club.members.admin.id}`, { roles: ['editor'] })
    expect(demote.status).toBe(409)
    expect(demote.data.data.fields.roles).toMatch(/at least one admin/)
    expect((await admin.delete(`/api/clubs/${club.id}/members/${club.members.admin.id}`)).status).toBe(409)
    expect((await admin.get(`/api/clubs/${club.id}`)).data.roles).toEqual(['admin'])
  })

  it('removes a member, who then gets 404 for the club', async () => {
    const c = await makeClub('remove')
    const admin = await as(c, 'admin')
    const editor = await as(c, 'editor')
    expect((await admin.delete(`/api/clubs/${c.id}/members/${c.members.editor.id}`)).status).toBe(204)
    expect((await editor.get(`/api/clubs/${c.id}`)).status).toBe(404)
    expect((await admin.delete(`/api/clubs/${c.id}/members/${c.members.editor.id}`)).status).toBe(404)
  })

  it('validates ids and roles with messages that name the field', async () => {
    const admin = await as(club, 'admin')
    const badId = await admin.get('/api/clubs/-3/members')
    expect(badId.status).toBe(400)
    expect(badId.data.data.fields).toHaveProperty('clubId')
    const huge = await admin.get('/api/clubs/99999999999999999999')
    expect(huge.status).toBe(400)
    const badRole = await admin.patch(`/api/clubs/${club.id}/members/${club.members.editor.id}`, { roles: ['king'] })
    expect(badRole.status).toBe(400)
    expect(badRole.data.data.fields).toHaveProperty(['roles.0'])
  })
})

describe('logo upload', () => {
  // A real 1×1 PNG (signature, IHDR, IDAT, IEND), made once with zlib and kept here as bytes.
  const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c489'
    + '0000000b49444154789c63f80f040009fb03fdfb5e6b2b0000000049454e44ae426082', 'hex')

  function upload(client: Client, file: Blob, name: string) {
    const form = new FormData()
    form.append('logo', file, name)
    return client.request('POST', `/api/clubs/${club.id}/logo`, { body: form })
  }

  it('stores the logo in object storage and serves the same bytes publicly', async () => {
    const admin = await as(club, 'admin')
    const res = await upload(admin, new Blob([png], { type: 'image/png' }), 'crest.png')
    expect(res.status).toBe(200)
    expect(res.data.logoUrl).toMatch(/^\/media\/logos\/\d+\/[0-9a-f]{32}\.png$/)
    const served = await fetch(new URL(res.data.logoUrl, process.env.TEST_APP_URL ?? 'http://127.0.0.1:3100'))
    expect(served.headers.get('content-type')).toBe('image/png')
    expect(Buffer.from(await served.arrayBuffer()).equals(png)).toBe(true)

    // Read back through the S3 API itself, as any other S3 client would.
    const s3 = new S3Client({
      endpoint: process.env.FAKE_S3_ENDPOINT ?? 'http://127.0.0.1:4578', region: 'us-east-1', forcePathStyle: true,
      credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
      requestChecksumCalculation: 'WHEN_REQUIRED', responseChecksumValidation: 'WHEN_REQUIRED',
    })
    const object = await s3.send(new GetObjectCommand({ Bucket: 'unscathed', Key: res.data.logoUrl.replace('/media/', '') }))
    expect(Buffer.from(await object.Body!.transformToByteArray()).equals(png)).toBe(true)
  })

  it('checks the type from the content, not the name', async () => {
    const admin = await as(club, 'admin')
    const res = await upload(admin, new Blob(['<svg xmlns="http://www.w3.org/2000/svg"/>'], { type: 'image/png' }), 'looks.png')
    expect(res.status).toBe(400)
    expect(res.data.data.fields.logo).toBe('Use a PNG, JPEG or WebP image')
  })

  it('refuses files over 2 MB and empty forms, storing nothing', async () => {
    const admin = await as(club, 'admin')
    const before = (await admin.get(`/api/clubs/${club.id}`)).data.logoUrl
    const big = Buffer.concat([png, Buffer.alloc(2 * 1024 * 1024 + 10)])
    expect((await upload(admin, new Blob([big], { type: 'image/png' }), 'big.png')).status).toBe(400)
    const empty = await admin.request('POST', `/api/clubs/${club.id}/logo`, { body: new FormData() })
    expect(empty.status).toBe(400)
    expect((await admin.get(`/api/clubs/${club.id}`)).data.logoUrl).toBe(before)
  })

  it('removes the logo', async () => {
    const admin = await as(club, 'admin')
    expect((await admin.delete(`/api/clubs/${club.id}/logo`)).status).toBe(204)
    expect((await admin.get(`/api/clubs/${club.id}`)).data.logoUrl).toBeNull()
  })
})

describe('public club data', () => {
  it('shows the public profile to anyone and 404 for an unknown club', async () => {
    const anon = new Client()
    const res = await anon.get(`/api/public/clubs/${club.slug}`)
    expect(res.status).toBe(200)
    expect(res.data).not.toHaveProperty('id')
    expect(JSON.stringify(res.data)).not.toContain('@')
    expect((await anon.get('/api/public/clubs/no-such-club')).status).toBe(404)
  })
})
