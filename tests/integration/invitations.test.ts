import { randomBytes } from 'node:crypto'
import { afterAll, describe, expect, it } from 'vitest'
import { Client, linkIn, waitForMail } from '../support/http'
import { makeClub, PASSWORD, pool, tableCounts } from '../support/fixtures'

afterAll(() => pool.end())

const freshEmail = () => `invitee-${randomBytes(4).toString('hex')}@test.example`
const tokenOf = (link: string) => link.split('/').pop()!

describe('invitations', () => {
  it('takes an invitee from the e-mail link to a signed-in member with the invited roles', async () => {
    const club = await makeClub('invite')
    const admin = await new Client().signIn(club.members.admin.email, PASSWORD)
    const email = freshEmail()
    const sent = await admin.post(`/api/clubs/${club.id}/invitations`, { email, roles: ['editor', 'commentator'] })
    expect(sent.status).toBe(201)
    expect(sent.data.invitation.status).toBe('pending')

    const mail = await waitForMail(email)
    expect(mail.subject).toBe(`You are invited to ${club.name} on Unscathed`)
    const token = tokenOf(linkIn(mail, '/invite/'))

    const invitee = new Client()
    const shown = await invitee.get(`/api/invitations/${token}`)
    expect(shown.status).toBe(200)
    expect(shown.data).toMatchObject({ email, roles: ['commentator', 'editor'], existingAccount: false, club: { slug: club.slug } })

    const accepted = await invitee.post(`/api/invitations/${token}/accept`, { name: 'Nell Brackett', password: 'a long password' })
    expect(accepted.status).toBe(200)
    const account = await invitee.get('/api/account')
    expect(account.data.user.name).toBe('Nell Brackett')
    expect(account.data.clubs).toEqual([expect.objectContaining({ id: club.id, roles: ['commentator', 'editor'] })])

    // Single use: the same link is dead now.
    expect((await new Client().get(`/api/invitations/${token}`)).status).toBe(404)
    expect((await new Client().post(`/api/invitations/${token}/accept`, { name: 'Again', password: 'a long password' })).status).toBe(404)
    // And the new member can sign in with the chosen password.
    await new Client().signIn(email, 'a long password')
  })

  it('lets an existing account join with its own password', async () => {
    const club = await makeClub('invite')
    const elsewhere = await makeClub('home')
    const admin = await new Client().signIn(club.members.admin.email, PASSWORD)
    const email = elsewhere.members.streamer.email
    expect((await admin.post(`/api/clubs/${club.id}/invitations`, { email, roles: ['streamer'] })).status).toBe(201)
    const token = tokenOf(linkIn(await waitForMail(email), '/invite/'))
    const c = new Client()
    expect((await c.get(`/api/invitations/${token}`)).data.existingAccount).toBe(true)
    const wrong = await c.post(`/api/invitations/${token}/accept`, { password: 'not my password' })
    expect(wrong.status).toBe(400)
    expect(wrong.data.data.fields.password).toMatch(/existing account/)
    expect((await c.post(`/api/invitations/${token}/accept`, { password: PASSWORD })).status).toBe(200)
    const clubs = (await c.get('/api/account')).data.clubs.map((x: { id: number }) => x.id).sort()
    expect(clubs).toEqual([club.id, elsewhere.id].sort())
  })

  it('resends with a new link and kills the old one', async () => {
    const club = await makeClub('invite')
    const admin = await new Client().signIn(club.members.admin.email, PASSWORD)
    const email = freshEmail()
    const { data } = await admin.post(`/api/clubs/${club.id}/invitations`, { email, roles: ['organizer'] })
    const first = tokenOf(linkIn(await waitForMail(email, 1), '/invite/'))
    expect((await admin.post(`/api/clubs/${club.id}/invitations/${data.invitation.id}/resend`)).status).toBe(200)
    const second = tokenOf(linkIn(await waitForMail(email, 2), '/invite/'))
    expect(second).not.toBe(first)
    expect((await new Client().get(`/api/invitations/${first}`)).status).toBe(404)
    expect((await new Client().get(`/api/invitations/${second}`)).status).toBe(200)
  })

  it('revokes an invitation and refuses expired ones', async () => {
    const club = await makeClub('invite')
    const admin = await new Client().signIn(club.members.admin.email, PASSWORD)
    const email = freshEmail()
    const { data } = await admin.post(`/api/clubs/${club.id}/invitations`, { email, roles: ['editor'] })
    const token = tokenOf(linkIn(await waitForMail(email), '/invite/'))
    expect((await admin.delete(`/api/clubs/${club.id}/invitations/${data.invitation.id}`)).status).toBe(204)
    expect((await new Client().get(`/api/invitations/${token}`)).status).toBe(404)

    const late = freshEmail()
    const { data: d2 } = await admin.post(`/api/clubs/${club.id}/invitations`, { email: late, roles: ['editor'] })
    const lateToken = tokenOf(linkIn(await waitForMail(late), '/invite/'))
    await pool.query(`update invitations set expires_at = now() - interval '1 minute' where id = $1`, [d2.invitation.id])
    const res = await new Client().post(`/api/invitations/${lateToken}/accept`, { name: 'Too Late', password: 'a long password' })
    expect(res.status).toBe(404)
    expect(res.data.message).toMatch(/expired/)
    const listed = await admin.get(`/api/clubs/${club.id}/members`)
    expect(listed.data.invitations.find((i: { id: number }) => i.id === d2.invitation.id).status).toBe('expired')
  })

  it('refuses to invite someone who is already a member (409 on email)', async () => {
    const club = await makeClub('invite')
    const admin = await new Client().signIn(club.members.admin.email, PASSWORD)
    const before = await tableCounts()
    const res = await admin.post(`/api/clubs/${club.id}/invitations`, { email: club.members.editor.email, roles: ['admin'] })
    expect(res.status).toBe(409)
    expect(res.data.data.fields).toHaveProperty('email')
    expect(await tableCounts()).toEqual(before)
  })

  it('lets only admins invite', async () => {
    const club = await makeClub('invite')
    const organizer = await new Client().signIn(club.members.organizer.email, PASSWORD)
    expect((await organizer.post(`/api/clubs/${club.id}/invitations`, { email: freshEmail(), roles: ['admin'] })).status).toBe(403)
  })

  it('answers a malformed token with 400 and an unknown one with 404', async () => {
    expect((await new Client().get('/api/invitations/short')).status).toBe(400)
    expect((await new Client().get(`/api/invitations/${'A'.repeat(43)}`)).status).toBe(404)
  })
})

describe('password reset', () => {
  it('mails a single-use link that sets a new password and signs in', async () => {
    const club = await makeClub('reset')
    const email = club.members.editor.email
    expect((await new Client().post('/api/auth/reset-request', { email })).status).toBe(200)
    const mail = await waitForMail(email)
    expect(mail.subject).toBe('Reset your Unscathed password')
    const token = tokenOf(linkIn(mail, '/reset-password/'))

    const c = new Client()
    const weak = await c.post('/api/auth/reset-confirm', { token, password: 'short' })
    expect(weak.status).toBe(400)
    expect(weak.data.data.fields).toHaveProperty('password')
    const done = await c.post('/api/auth/reset-confirm', { token, password: 'brand new password' })
    expect(done.status).toBe(200)
    expect((await c.get('/api/account')).status).toBe(200)

    const again = await new Client().post('/api/auth/reset-confirm', { token, password: 'another new password' })
    expect(again.status).toBe(400)
    expect(again.data.data.fields.token).toMatch(/expired or was already used/)
    expect((await new Client().post('/api/auth/sign-in', { email, password: PASSWORD })).status).toBe(401)
    await new Client().signIn(email, 'brand new password')
  })

  it('answers the same for an unknown address and sends nothing', async () => {
    const email = freshEmail()
    const res = await new Client().post('/api/auth/reset-request', { email })
    expect(res.status).toBe(200)
    expect(res.data).toEqual({ ok: true })
    await expect(waitForMail(email, 1, 800)).rejects.toThrow(/no mail/)
  })
})

describe('account', () => {
  it('changes the name and the password with the current one', async () => {
    const club = await makeClub('account')
    const me = await new Client().signIn(club.members.organizer.email, PASSWORD)
    expect((await me.patch('/api/account', { name: '  Tobias Q.  ' })).data.user.name).toBe('Tobias Q.')
    const wrong = await me.post('/api/account/password', { currentPassword: 'nope', newPassword: 'another long one' })
    expect(wrong.status).toBe(400)
    expect(wrong.data.data.fields).toHaveProperty('currentPassword')
    expect((await me.post('/api/account/password', { currentPassword: PASSWORD, newPassword: 'another long one' })).status).toBe(204)
    await new Client().signIn(club.members.organizer.email, 'another long one')
  })
})

describe('development inbox', () => {
  it('is open to admins only', async () => {
    const club = await makeClub('inbox')
    expect((await (await new Client().signIn(club.members.admin.email, PASSWORD)).get('/api/dev/inbox')).status).toBe(200)
    expect((await (await new Client().signIn(club.members.editor.email, PASSWORD)).get('/api/dev/inbox')).status).toBe(403)
  })
})
