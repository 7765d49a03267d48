import { expect, test } from '@playwright/test'
import { DEMO_CLUB, demo, signIn, waitForMail } from './support'

test('an admin invites a new member, who follows the e-mailed link, sets a password and signs in', async ({ page, browser }) => {
  const email = `new-member-${Date.now()}@wrenmouth.example`
  await signIn(page, demo.admin)
  await page.goto(`/clubs/${DEMO_CLUB}/members`)
  const form = page.locator('form', { has: page.getByRole('button', { name: 'Send invitation' }) })
  await form.getByLabel('E-mail').fill(email)
  await form.getByLabel('Editor').check()
  await form.getByLabel('Streamer').check()
  await form.getByRole('button', { name: 'Send invitation' }).click()
  await expect(page.getByRole('status').filter({ hasText: `Invitation sent to ${email}` })).toBeVisible()
  await expect(page.getByText(email, { exact: true })).toBeVisible()

  const mail = await waitForMail(email)
  const link = /https?:\/\/\S+\/invite\/[A-Za-z0-9_-]+/.exec(mail.text)?.[0]
  expect(link).toBeTruthy()

  // The invitee uses a browser of their own, with no session.
  const context = await browser.newContext()
  const invitee = await context.newPage()
  await invitee.goto(new URL(link!).pathname)
  await expect(invitee.getByText('Saltmarsh Sword Guild').first()).toBeVisible()
  await invitee.getByLabel('Your name').fill('Wren Ashdown')
  await invitee.getByLabel('Password').fill('my own long password')
  await invitee.getByRole('button', { name: 'Join the club' }).click()
  await expect(invitee).toHaveURL(new RegExp(`/clubs/${DEMO_CLUB}`))
  await expect(invitee.getByRole('navigation', { name: 'Club' }).getByRole('link')).toHaveText(['Overview', 'Cue desk', 'Footage', 'Breakdowns', 'Cards', 'Readers'])

  // Signed out, the new password works on the sign-in page.
  await invitee.getByRole('button', { name: 'Sign out' }).click()
  await invitee.goto('/sign-in')
  await invitee.getByLabel('E-mail').fill(email)
  await invitee.getByLabel('Password').fill('my own long password')
  await invitee.getByRole('button', { name: 'Sign in' }).click()
  await expect(invitee).toHaveURL(/\/clubs/)
  await context.close()
})

test('the admin can read the invitation in the development inbox', async ({ page }) => {
  await signIn(page, demo.admin)
  await page.goto('/dev/inbox')
  await expect(page.getByRole('link', { name: /You are invited to Saltmarsh Sword Guild/ }).first()).toBeVisible()
})
