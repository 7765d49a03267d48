import { expect, test } from '@playwright/test'
import { DEMO_CLUB, demo, signIn } from './support'

// The demo event is loaded through the API by the test command, as by `npm start`.
const EVENT = `/api/public/events/${DEMO_CLUB}/wrenmouth-harvest-open`

test('the published demo event has a finished sword-and-buckler pool phase and a longsword tournament in progress', async ({ request }) => {
  const res = await request.get(EVENT)
  expect(res.status()).toBe(200)
  const body = await res.json()
  expect(JSON.stringify(body)).not.toContain('@')
  const byName = new Map<string, { id: number, phase: string }>(body.tournaments.map((t: { id: number, name: string, phase: string }) => [t.name, t]))
  expect(byName.get('Sword and buckler')?.phase).toBe('finals')
  expect(byName.get('Longsword')?.phase).toBe('pools')

  const sb = await (await request.get(`${EVENT}/tournaments/${byName.get('Sword and buckler')!.id}`)).json()
  const rows = sb.standings.pools.flatMap((p: { rows: unknown[] }) => p.rows) as { boutsFought: number, unharmed: number, survivalRate: number }[]
  expect(rows).toHaveLength(18)
  // Pools of six with three bouts per opponent: 5 × 3 = 15 counted bouts each (common practice, no source).
  for (const row of rows) {
    expect(row.boutsFought).toBe(15)
    expect(row.survivalRate).toBeCloseTo(row.unharmed / 15, 10)
  }
  const semis = sb.finals.bracket.matches.filter((m: { name: string }) => m.name === 'Semifinal')
  expect(semis.map((m: { sides: { seed: number }[] }) => m.sides.map(s => s.seed))).toEqual([[1, 4], [2, 3]])
})

test('the organizer sees what each ring of the demo event fences now, on deck and next', async ({ page }) => {
  await signIn(page, demo.organizer)
  await page.goto(`/clubs/${DEMO_CLUB}/events`)
  await page.getByRole('link', { name: /Wrenmouth Harvest Open/ }).first().click()
  const rings = page.locator('section[aria-labelledby="event-rings"]')
  await expect(rings.getByRole('heading', { name: 'Ring 1' })).toBeVisible()
  await expect(rings.getByRole('heading', { name: 'Ring 3' })).toBeVisible()
  // Half of every longsword pool is still to fence, so every ring has a match on deck.
  await expect(rings.locator('article')).toHaveCount(3)
  for (const ring of await rings.locator('article').all()) await expect(ring).toContainText(/On deck\s*\S+.* v /s)
})
