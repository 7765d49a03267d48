import { expect, test } from '@playwright/test'
import { DEMO_CLUB } from './support'

test('an anonymous visitor of a private page gets the sign-in page and comes back after', async ({ page }) => {
  await page.goto(`/clubs/${DEMO_CLUB}/members`)
  await expect(page).toHaveURL(/\/sign-in\?redirect=/)
  await expect(page.getByRole('button', { name: 'Sign in' })).toBeVisible()
  await page.getByLabel('E-mail').fill('admin@saltmarsh.example')
  await page.getByLabel('Password').fill('saltmarsh-admin')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page).toHaveURL(new RegExp(`/clubs/${DEMO_CLUB}/members$`))
})

test('anonymous API requests get 401', async ({ request }) => {
  for (const path of ['/api/account', '/api/clubs/1', '/api/clubs/1/members', '/api/dev/inbox']) {
    const res = await request.get(path)
    expect(res.status(), path).toBe(401)
  }
})

test('the home page says what Unscathed is and leads to sign-in and the club site', async ({ page }) => {
  await page.goto('/')
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible()
  await expect(page.getByRole('link', { name: /sign in/i }).first()).toBeVisible()
  await page.getByRole('link', { name: /Saltmarsh Sword Guild|club site/i }).first().click()
  await expect(page).toHaveURL(new RegExp(`/site/${DEMO_CLUB}`))
  await expect(page.getByRole('heading', { name: 'Saltmarsh Sword Guild' })).toBeVisible()
  await expect(page.getByText(/1600 N/)).toBeVisible()
})

test('an unknown page gets a friendly error page without a stack trace', async ({ page }) => {
  const res = await page.goto('/site/no-such-club')
  expect(res?.status()).toBe(404)
  await expect(page.getByRole('link', { name: /home/i }).first()).toBeVisible()
  // A stack frame looks like "at fn (file.mjs:12:34)".
  await expect(page.locator('body')).not.toContainText(/\bat .*:\d+:\d+/)
  await expect(page.locator('body')).not.toContainText(/node_modules|\.mjs/)
})

test('a wrong password shows a message and keeps the visitor on the sign-in page', async ({ page }) => {
  await page.goto('/sign-in')
  await page.getByLabel('E-mail').fill('editor@saltmarsh.example')
  await page.getByLabel('Password').fill('not the password')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByText('E-mail or password is wrong')).toBeVisible()
  await expect(page).toHaveURL(/\/sign-in/)
})
