import { afterAll, describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import { makeClub, PASSWORD, pool, tableCounts } from '../support/fixtures'

afterAll(async () => {
  // The browser tests sign in from the same address: leave no failures behind to throttle them.
  await pool.query('delete from sign_in_failures')
  await pool.end()
})

describe('sign-in', () => {
  it('signs in with e-mail and password and sets an HttpOnly, SameSite session cookie', async () => {
    const club = await makeClub('auth')
    const me = new Client()
    const res = await me.post('/api/auth/sign-in', { email: club.members.editor.email.toUpperCase(), password: PASSWORD })
    expect(res.status).toBe(200)
    expect(res.data.user.email).toBe(club.members.editor.email)
    const cookie = me.setCookieHeaders.find(c => c.startsWith('nuxt-session='))
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
    const account = await me.get('/api/account')
    expect(account.status).toBe(200)
    expect(account.data.clubs.map((c: { id: number }) => c.id)).toContain(club.id)
  })

  it('refuses a wrong password with 401 and a plain message', async () => {
    const club = await makeClub('auth')
    const res = await new Client().post('/api/auth/sign-in', { email: club.members.admin.email, password: 'wrong password' })
    expect(res.status).toBe(401)
    expect(res.data.message).toBe('E-mail or password is wrong')
  })

  it('answers an unknown account exactly like a wrong password', async () => {
    const res = await new Client().post('/api/auth/sign-in', { email: 'nobody@test.example', password: 'whatever' })
    expect(res.status).toBe(401)
    expect(res.data.message).toBe('E-mail or password is wrong')
  })

  it('names each bad field in a 400', async () => {
    const res = await new Client().post('/api/auth/sign-in', { email: 'not-an-address', password: 12 })
    expect(res.status).toBe(400)
    expect(res.data.data.fields).toHaveProperty('email')
    expect(res.data.data.fields).toHaveProperty('password')
    expect(res.data.message).toMatch(/^email: /)
  })

  it('refuses unknown fields, truncated JSON and non-JSON bodies with 4xx, not 500', async () => {
    const c = new Client()
    const extra = await c.post('/api/auth/sign-in', { email: 'a@test.example', password: 'x', role: 'admin' })
    expect(extra.status).toBe(400)
    expect(extra.data.message).toMatch(/Unknown field: role/)
    const truncated = await c.request('POST', '/api/auth/sign-in', { body: '{"email":', headers: { 'content-type': 'application/json' } })
    expect(truncated.status).toBe(400)
    expect(truncated.data.message).toBe('body: not valid JSON')
    const form = await c.request('POST', '/api/auth/sign-in', { body: 'email=a', headers: { 'content-type': 'application/x-www-form-urlencoded' } })
    expect(form.status).toBe(415)
    const array = await c.post('/api/auth/sign-in', [1, 2])
    expect(array.status).toBe(400)
  })

  it('signs out: the session ends and private routes answer 401 again', async () => {
    const club = await makeClub('auth')
    const me = await new Client().signIn(club.members.streamer.email, PASSWORD)
    expect((await me.get('/api/account')).status).toBe(200)
    expect((await me.delete('/api/_auth/session')).status).toBe(200)
    expect((await me.get('/api/account')).status).toBe(401)
  })

  it('locks an account for a while after five failures, even for the right password', async () => {
    const club = await makeClub('throttle')
    const c = new Client()
    const statuses: number[] = []
    for (let i = 0; i < 5; i++) statuses.push((await c.post('/api/auth/sign-in', { email: club.members.admin.email, password: `wrong-${i}` })).status)
    expect(statuses).toEqual([401, 401, 401, 401, 401])
    const locked = await c.post('/api/auth/sign-in', { email: club.members.admin.email, password: PASSWORD })
    expect(locked.status).toBe(429)
    expect(locked.headers.get('retry-after')).toBe('900')
    // Another account from the same address is not locked by this one.
    expect((await c.post('/api/auth/sign-in', { email: club.members.editor.email, password: PASSWORD })).status).toBe(200)
  })

  it('locks an address after twenty failures across accounts', async () => {
    await pool.query('delete from sign_in_failures')
    const c = new Client()
    for (let i = 0; i < 20; i++) {
      const res = await c.post('/api/auth/sign-in', { email: `spray-${i}@test.example`, password: 'guess' })
      expect(res.status).toBe(401)
    }
    const club = await makeClub('throttle')
    expect((await c.post('/api/auth/sign-in', { email: club.members.admin.email, password: PASSWORD })).status).toBe(429)
    await pool.query('delete from sign_in_failures')
  })
})

describe('anonymous callers', () => {
  const privateRoutes: [string, string][] = [
    ['GET', '/api/account'],
    ['PATCH', '/api/account'],
    ['POST', '/api/account/password'],
    ['GET', '/api/clubs/1'],
    ['PATCH', '/api/clubs/1'],
    ['POST', '/api/clubs/1/logo'],
    ['DELETE', '/api/clubs/1/logo'],
    ['GET', '/api/clubs/1/members'],
    ['PATCH', '/api/clubs/1/members/1'],
    ['DELETE', '/api/clubs/1/members/1'],
    ['POST', '/api/clubs/1/invitations'],
    ['POST', '/api/clubs/1/invitations/1/resend'],
    ['DELETE', '/api/clubs/1/invitations/1'],
    ['GET', '/api/dev/inbox'],
  ]

  it.each(privateRoutes)('get 401 from %s %s and change nothing', async (method, path) => {
    const before = await tableCounts()
    const res = await new Client().request(method, path, { json: method === 'GET' || method === 'DELETE' ? undefined : { name: 'x', roles: ['admin'] } })
    expect(res.status).toBe(401)
    expect(res.data.message).toBe('Sign in first')
    expect(await tableCounts()).toEqual(before)
  })

  it('get the sign-in page, not the private page, in a browser-like request', async () => {
    const res = await new Client().request('GET', '/clubs/saltmarsh-sword-guild/members', { headers: { accept: 'text/html' } })
    expect([200, 302]).toContain(res.status)
    if (res.status === 302) expect(res.headers.get('location')).toMatch(/^\/sign-in\?redirect=/)
    else expect(res.text).toContain('Sign in')
  })
})
