import { expect, test, type APIRequestContext } from '@playwright/test'
import { DEMO_CLUB, demo, signIn } from './support'

// Invented fighters of invented clubs (the demo scenario): two per club, so the draw has clubs to part.
const FIGHTERS = [
  ['Wenna Scarrow', 'Ironquay Fencing Hall', '1'],
  ['Cador Pellow', 'North Downs Buckler Circle', '2'],
  ['Jory Tremaine', 'Lanterngate Historical Fencing', ''],
  ['Morvoren Keast', 'Old Mill Fencing School', ''],
  ['Talan Rosevear', 'Ironquay Fencing Hall', ''],
  ['Elowen Dunstan', 'North Downs Buckler Circle', ''],
  ['Kenan Polglase', 'Lanterngate Historical Fencing', ''],
  ['Demelza Opie', 'Old Mill Fencing School', ''],
] as const

interface PoolMatch {
  id: number
  version: number
  status: string
  sideA: { name: string } | null
  sideB: { name: string } | null
}

async function poolMatches(request: APIRequestContext, base: string): Promise<PoolMatch[]> {
  const res = await request.get(`${base}/pools`)
  expect(res.status()).toBe(200)
  const { pools } = await res.json() as { pools: { matches: PoolMatch[] }[] }
  return pools.flatMap(pool => pool.matches)
}

test('the organizer sets up a tournament, runs its pools and reaches the bracket', async ({ page }) => {
  test.setTimeout(180_000)
  const stamp = Date.now().toString(36)
  const ruleSetName = `Spring first hit ${stamp}`
  const eventName = `Gullhaven Spring Bout ${stamp}`

  await signIn(page, demo.organizer)
  const account = await (await page.request.get('/api/account')).json() as { clubs: { id: number, slug: string }[] }
  const clubId = account.clubs.find(c => c.slug === DEMO_CLUB)!.id

  // A rule set from the first-hit preset, with its plain-language summary beside the form.
  await page.goto(`/clubs/${DEMO_CLUB}/rule-sets`)
  await page.getByLabel('First hit, three bouts').check()
  await page.getByLabel('Name', { exact: true }).fill(ruleSetName)
  await page.getByRole('button', { name: 'Create and edit' }).click()
  await expect(page.getByRole('heading', { level: 1, name: ruleSetName })).toBeVisible()
  await expect(page.getByText('Version 1', { exact: false }).first()).toBeVisible()
  await expect(page.getByText('A match is 3 bouts.')).toBeVisible()

  // The event, with the safety facts the public page needs.
  await page.goto(`/clubs/${DEMO_CLUB}/events/new`)
  await page.getByLabel('Event name').fill(eventName)
  await page.getByLabel('First day').fill('2027-04-17')
  await page.getByLabel('Venue').fill('The Rope Walk, Gullhaven')
  await page.getByLabel('Rings').fill('2')
  await page.getByLabel('Emergency number').fill('112')
  await page.getByLabel('First-aid point').fill('By the east door, beside ring 1')
  await page.getByRole('button', { name: 'Create the event' }).click()
  await expect(page.getByRole('heading', { level: 1, name: eventName })).toBeVisible()

  // A tournament that uses the new rule set: eight fighters make two pools of four.
  await page.getByLabel('Tournament name').fill('Sword and buckler')
  await page.getByLabel('Weapon').fill('Sword and buckler')
  await page.getByLabel('Rule set').selectOption({ label: ruleSetName })
  await page.getByLabel('Fighters per pool').fill('4')
  await page.getByLabel('Fighters in the finals').fill('4')
  await page.getByRole('button', { name: 'Add the tournament' }).click()
  await expect(page).toHaveURL(/\/events\/\d+\/tournaments\/\d+$/)
  const [, eventId, tournamentId] = page.url().match(/\/events\/(\d+)\/tournaments\/(\d+)$/)!
  const api = `/api/clubs/${clubId}/events/${eventId}/tournaments/${tournamentId}`
  const tournamentPage = page.url()

  // CSV import: preview first, then import all rows at once.
  const csv = ['name,club,seed', ...FIGHTERS.map(f => f.join(','))].join('\n')
  await page.getByLabel('Rows to import').fill(csv)
  await page.getByRole('button', { name: 'Preview', exact: true }).click()
  const preview = page.getByRole('table', { name: /Rows of the file/ })
  await expect(preview.getByRole('row')).toHaveCount(FIGHTERS.length + 1)
  await expect(page.getByText('0 with errors')).toBeVisible()
  await page.getByRole('button', { name: `Import ${FIGHTERS.length} entries` }).click()
  await expect(page.getByText(`Imported ${FIGHTERS.length} entries`)).toBeVisible()
  await expect(page.getByRole('heading', { name: `${FIGHTERS.length} entries` })).toBeVisible()

  // Check-in: the button waits for both safety checks.
  await page.getByRole('link', { name: /^Check-in/ }).click()
  await expect(page.getByText(`0 of ${FIGHTERS.length}`)).toBeVisible()
  for (const [name] of FIGHTERS) {
    const card = page.getByRole('listitem').filter({ hasText: name })
    const button = card.getByRole('button', { name: `Check in ${name}` })
    await expect(button).toBeDisabled()
    await card.getByLabel('Kit checked').check()
    await expect(button).toBeDisabled()
    await card.getByLabel('Weapon flex-checked, tip covered').check()
    await button.click()
    await expect(page.getByText(`${name} is checked in.`)).toBeVisible()
  }
  await expect(page.getByText(`${FIGHTERS.length} of ${FIGHTERS.length}`)).toBeVisible()

  // The pools: the confirm says what starting them freezes; then a preview and the draw.
  await page.getByRole('button', { name: 'Start the pools…' }).click()
  const confirm = page.getByRole('dialog', { name: 'Start the pools?' })
  await expect(confirm.getByText(/later edits of the rule set do not reach it/)).toBeVisible()
  await confirm.getByRole('button', { name: 'Start the pools' }).click()
  await expect(page).toHaveURL(/\/pools$/)
  await page.getByRole('button', { name: 'Preview a draw' }).click()
  await expect(page.getByText(/Preview with key/)).toBeVisible()
  await page.getByRole('button', { name: 'Keep this draw' }).click()
  await expect(page.getByRole('heading', { name: '2 pools' })).toBeVisible()
  await expect(page.getByRole('heading', { name: 'Pool 1', exact: true })).toBeVisible()

  // One match through the result form: three bouts, an undo before saving, one POST.
  const matches = await poolMatches(page.request, api)
  expect(matches).toHaveLength(12)
  const first = matches[0]!
  const a = first.sideA!.name
  const b = first.sideB!.name
  await page.goto(`${tournamentPage}/matches/${first.id}`)
  await page.getByRole('button', { name: `${a} hit` }).click()
  await page.getByRole('button', { name: /Head · cut/ }).click()
  await page.getByRole('button', { name: `${b} hit` }).click()
  await page.getByRole('button', { name: /Torso · thrust/ }).click()
  await page.getByRole('button', { name: 'Not seen' }).click()
  await page.getByRole('button', { name: 'Undo last' }).click()
  await page.getByRole('button', { name: `${a} hit` }).click()
  await page.getByRole('button', { name: /Arms · cut/ }).click()
  // The live preview: head 3 + arms 1 against torso 2, and the match ends after the third bout.
  await expect(page.getByRole('status').filter({ hasText: `${a} wins 4–2` })).toBeVisible()
  await page.getByRole('button', { name: 'Save 3 entries' }).click()
  await expect(page.getByText('Saved 3 entries.')).toBeVisible()

  // The rest through the API, as a ring desk would send them.
  for (const match of matches.slice(1)) {
    const entries = [
      { id: crypto.randomUUID(), kind: 'clean', side: 'a', target: 'torso', action: 'cut' },
      { id: crypto.randomUUID(), kind: 'double', a: { target: 'arms', action: 'cut' }, b: { target: 'legs', action: 'cut' } },
      { id: crypto.randomUUID(), kind: 'clean', side: 'b', target: 'head', action: 'thrust' },
    ]
    const res = await page.request.post(`${api}/matches/${match.id}/entries`, { data: { expectedVersion: match.version, entries } })
    expect(res.status()).toBe(201)
  }

  // Standings with survival rates, and every pool complete.
  await page.goto(`${tournamentPage}/standings`)
  await expect(page.getByText('Every pool match is settled: the tables are final.')).toBeVisible()
  const pool1 = page.getByRole('table', { name: 'Pool 1 table' })
  await expect(pool1.getByRole('row')).toHaveCount(5)
  await expect(pool1.getByRole('columnheader', { name: /Survival/ })).toBeVisible()
  await expect(pool1.getByText(/\d+(\.\d)?%/).first()).toBeVisible()

  // The finals: the bracket with its semifinals and the bronze match.
  await page.getByRole('button', { name: 'Start the finals…' }).click()
  await page.getByRole('dialog', { name: 'Start the finals?' }).getByRole('button', { name: 'Start the finals' }).click()
  await expect(page).toHaveURL(/\/finals$/)
  await expect(page.getByRole('heading', { name: 'Semifinal' })).toBeVisible()
  await expect(page.getByRole('heading', { name: 'Bronze match' })).toBeVisible()
  await expect(page.getByRole('article', { name: /^Semifinal: / })).toHaveCount(2)
})
