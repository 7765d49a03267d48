import { expect, test } from '@playwright/test'
import { clubNavigation } from '../../shared/utils/roles'
import { DEMO_CLUB, demo, signIn } from './support'

const cases = [
  ['admin', ['admin']],
  ['organizer', ['organizer']],
  ['scorekeeper', ['scorekeeper']],
  ['streamer', ['streamer']],
  ['commentator', ['commentator']],
  ['editor', ['editor']],
] as const

for (const [who, roles] of cases) {
  test(`the ${who} signs in and sees only their own navigation`, async ({ page }) => {
    await signIn(page, demo[who])
    await page.goto(`/clubs/${DEMO_CLUB}`)
    const nav = page.getByRole('navigation', { name: 'Club' })
    const expected = clubNavigation(DEMO_CLUB, [...roles]).map(item => item.label)
    await expect(nav.getByRole('link')).toHaveText(expected)
  })
}

test('a scorekeeper cannot change roles: the page refuses and the API answers 403', async ({ page }) => {
  await signIn(page, demo.scorekeeper)
  await page.goto(`/clubs/${DEMO_CLUB}/members`)
  await expect(page.getByText(/403|not allowed|needs the Admin role/i).first()).toBeVisible()
  const account = await (await page.request.get('/api/account')).json()
  const club = account.clubs.find((c: { slug: string }) => c.slug === DEMO_CLUB)
  const res = await page.request.patch(`/api/clubs/${club.id}/members/${account.user.id}`, { data: { roles: ['admin', 'scorekeeper'] } })
  expect(res.status()).toBe(403)
  expect((await (await page.request.get(`/api/clubs/${club.id}`)).json()).roles).toEqual(['scorekeeper'])
})

test('a member of another club sees none of this club', async ({ page }) => {
  await signIn(page, demo.otherClubAdmin)
  await page.goto(`/clubs/${DEMO_CLUB}/members`)
  await expect(page.getByText(/404|not found/i).first()).toBeVisible()
  await expect(page.getByText('admin@saltmarsh.example')).toHaveCount(0)
  const res = await page.request.get('/api/public/clubs/' + DEMO_CLUB)
  const { slug } = await res.json()
  expect(slug).toBe(DEMO_CLUB)
  // The private side: the demo club is id 1 in a freshly seeded database, but ask rather than assume.
  for (let id = 1; id <= 3; id++) {
    const club = await page.request.get(`/api/clubs/${id}`)
    if (club.status() === 200) expect((await club.json()).slug).not.toBe(DEMO_CLUB)
    else expect(club.status()).toBe(404)
    const members = await page.request.get(`/api/clubs/${id}/members`)
    expect(await members.text()).not.toContain('saltmarsh.example')
  }
})
