import { expect, test, type APIRequestContext, type Page } from '@playwright/test'
import { DEMO_CLUB, demo, signIn } from './support'

// Each test makes its own rule set, event and fighters in the demo club and touches nothing else.
// Invented fighters of invented clubs (the demo scenario).
const FIGHTERS = [
  ['Ysolde Penrice', 'Ironquay Fencing Hall'],
  ['Gawen Trevail', 'North Downs Buckler Circle'],
  ['Rosenwyn Hale', 'Lanterngate Historical Fencing'],
  ['Piran Jewell', 'Old Mill Fencing School'],
  ['Tamsin Carlyon', 'Ironquay Fencing Hall'],
  ['Jowan Nancarrow', 'North Downs Buckler Circle'],
  ['Kerra Boscawen', 'Lanterngate Historical Fencing'],
  ['Austell Vage', 'Greyfield Sword Society'],
] as const

interface Setup { clubId: number, eventId: number, eventPage: string, ruleSetName: string, stamp: string }

async function ok(res: Awaited<ReturnType<APIRequestContext['post']>>, status = 200) {
  expect(res.status(), await res.text()).toBe(status)
  return res.json()
}

/** The organizer's own rule set and a two-ring event, through the API. */
async function setUp(page: Page, label: string): Promise<Setup> {
  await signIn(page, demo.organizer)
  const stamp = `${label} ${Date.now().toString(36)}`
  const account = await (await page.request.get('/api/account')).json() as { clubs: { id: number, slug: string }[] }
  const clubId = account.clubs.find(c => c.slug === DEMO_CLUB)!.id
  const ruleSetName = `Final-day first hit ${stamp}`
  await ok(await page.request.post(`/api/clubs/${clubId}/rule-sets`, { data: { name: ruleSetName, preset: 'first-hit-three-bouts' } }), 201)
  const event = await ok(await page.request.post(`/api/clubs/${clubId}/events`, {
    data: {
      name: `Gullhaven Finals Day ${stamp}`, slug: `gullhaven-finals-${stamp.replace(/\W+/g, '-').toLowerCase()}`,
      startsOn: '2027-05-22', endsOn: '2027-05-22', venue: 'The Rope Walk, Gullhaven', rings: 2,
      emergencyNumber: '112', firstAidPoint: 'By the east door, beside ring 1',
    },
  }), 201) as { id: number }
  return { clubId, eventId: event.id, eventPage: `/clubs/${DEMO_CLUB}/events/${event.id}`, ruleSetName, stamp }
}

/** Enters the eight fighters and checks them in, through the API; answers entry ids by name. */
async function enterFighters(request: APIRequestContext, clubId: number, api: string) {
  const ids = new Map<string, number>()
  for (const [name, clubName] of FIGHTERS) {
    const created = await request.post(`/api/clubs/${clubId}/fighters`, { data: { name, clubName } })
    const fighterId = created.status() === 201
      ? (await created.json()).id as number
      : ((await (await request.get(`/api/clubs/${clubId}/fighters?q=${encodeURIComponent(name)}`)).json()).fighters as { id: number, clubName: string }[])
          .find(f => f.clubName === clubName)!.id
    const entry = await ok(await request.post(`${api}/entries`, { data: { fighterId, seed: null } }), 201) as { id: number }
    await ok(await request.post(`${api}/entries/${entry.id}/check-in`, { data: { kitChecked: true, weaponChecked: true } }))
    ids.set(name, entry.id)
  }
  return ids
}

interface MatchRow { id: number, version: number, status: string, sideA: { name: string } | null, sideB: { name: string } | null }

/** Fences every open match through the API, as a ring desk would: side a wins 2 bouts to 1. */
async function fenceAll(request: APIRequestContext, api: string, matches: MatchRow[]) {
  for (const match of matches.filter(m => m.status === 'scheduled')) {
    const entries = ['a', 'a', 'b'].map(side => ({ id: crypto.randomUUID(), kind: 'clean', side, target: 'torso', action: 'cut' }))
    await ok(await request.post(`${api}/matches/${match.id}/entries`, { data: { expectedVersion: match.version, entries } }), 201)
  }
}

async function startPools(request: APIRequestContext, api: string) {
  await ok(await request.post(`${api}/phase`, { data: { to: 'pools' } }))
  const drawn = await ok(await request.post(`${api}/pools/draw`, { data: { drawKey: 'gullhaven' } }), 201) as { pools: { matches: MatchRow[] }[] }
  return drawn.pools.flatMap(p => p.matches)
}

test('the organizer sets up a round-robin final, edits it in Settings, takes a withdrawal back and reads the schedule', async ({ page }) => {
  test.setTimeout(120_000)
  const s = await setUp(page, 'settings')
  await ok(await page.request.post(`/api/clubs/${s.clubId}/events/${s.eventId}/tournaments`, {
    data: { name: 'Longsword', weapon: 'Longsword', ruleSetId: (await (await page.request.get(`/api/clubs/${s.clubId}/rule-sets`)).json()).ruleSets.find((r: { name: string }) => r.name === s.ruleSetName).id },
  }), 201)

  // The form: a round robin hides the match for third place and holds at most eight finalists.
  await page.goto(s.eventPage)
  const form = page.getByRole('form', { name: 'New tournament' })
  await form.getByLabel('Tournament name').fill('Sword and buckler')
  await form.getByLabel('Weapon').fill('Sword and buckler')
  await form.getByLabel('Rule set').selectOption({ label: s.ruleSetName })
  await form.getByLabel('Fighters per pool').fill('4')
  await form.getByLabel('Fighters in the finals').fill('9')
  await expect(form.getByLabel('Match for third place')).toBeChecked()
  await form.getByLabel('Round robin').check()
  await expect(form.getByText(/Every finalist fences every other once/)).toBeVisible()
  await expect(form.getByLabel('Match for third place')).toBeHidden()
  await form.getByRole('button', { name: 'Add the tournament' }).click()
  await expect(form.getByText('A round-robin final holds at most 8 fighters')).toBeVisible()
  await form.getByLabel('Fighters in the finals').fill('4')
  await form.getByRole('button', { name: 'Add the tournament' }).click()
  await expect(page).toHaveURL(/\/tournaments\/\d+$/)
  await expect(page.getByText(/pools of 4 · 4 to a round-robin final/)).toBeVisible()
  const tournamentPage = new URL(page.url()).pathname
  const api = `/api/clubs/${s.clubId}/events/${s.eventId}/tournaments/${tournamentPage.split('/').at(-1)}`

  // Settings: the same form, filled in; only what changed is sent, and the server's field error lands on its field.
  await page.getByRole('link', { name: 'Settings', exact: true }).click()
  const settings = page.getByRole('form', { name: 'Tournament settings' })
  await expect(settings.getByLabel('Tournament name')).toHaveValue('Sword and buckler')
  await expect(settings.getByLabel('Round robin')).toBeChecked()
  await expect(settings.getByRole('button', { name: 'Save changes' })).toBeDisabled()
  await settings.getByLabel('Tournament name').fill('Longsword')
  const patches: unknown[] = []
  page.on('request', (req) => {
    if (req.method() === 'PATCH') patches.push(req.postDataJSON())
  })
  await settings.getByRole('button', { name: 'Save changes' }).click()
  await expect(settings.getByText('This event already has a tournament with this name')).toBeVisible()
  await settings.getByLabel('Tournament name').fill('Sword and buckler open')
  await settings.getByLabel('Fighters in the finals').fill('3')
  await settings.getByRole('button', { name: 'Save changes' }).click()
  await expect(page.getByText('Saved: the tournament is up to date.')).toBeVisible()
  await expect(page.getByRole('heading', { level: 1, name: 'Sword and buckler open' })).toBeVisible()
  await expect(page.getByText(/pools of 4 · 3 to a round-robin final/)).toBeVisible()
  expect(patches.at(-1)).toEqual({ name: 'Sword and buckler open', qualifyCount: 3 })
  await expect(page.getByRole('button', { name: 'Delete the tournament' })).toBeEnabled()

  // Eight fighters, the pools started and drawn (through the API, as the entries tests show the screens).
  const ids = await enterFighters(page.request, s.clubId, api)
  await startPools(page.request, api)

  // In the pools the rules are locked, with the reason; the finals can still change; no deleting.
  await page.reload()
  await expect(settings.getByText(/Locked: the pools have started/)).toBeVisible()
  await expect(settings.getByLabel('Rule set')).toBeDisabled()
  await expect(settings.getByLabel('Fighters per pool')).toBeDisabled()
  await expect(settings.getByLabel('Fighters in the finals')).toBeEnabled()
  await expect(page.getByRole('button', { name: 'Delete the tournament' })).toBeDisabled()

  // A withdrawal, undone from the notice.
  const name = FIGHTERS[2][0]
  await page.getByRole('link', { name: /^Entries/ }).click()
  await page.getByRole('button', { name: `Withdraw ${name}` }).click()
  const dialog = page.getByRole('dialog', { name: `Withdraw ${name}?` })
  await expect(dialog.getByText(/can be taken back until the finals start/)).toBeVisible()
  await dialog.getByRole('button', { name: 'Injury' }).click()
  await dialog.getByRole('button', { name: 'Withdraw', exact: true }).click()
  await expect(page.getByText(`${name} has withdrawn: Injury.`)).toBeVisible()
  await page.getByRole('button', { name: 'Undo' }).click()
  await expect(page.getByText(`${name} is back in the tournament, checked in.`)).toBeVisible()
  const entryStatus = async () => ((await (await page.request.get(`${api}/entries`)).json()).entries as { id: number, status: string }[])
    .find(e => e.id === ids.get(name))!.status
  expect(await entryStatus()).toBe('checked-in')

  // Again, then taken back from the check-in list.
  await page.getByRole('button', { name: `Withdraw ${name}` }).click()
  await dialog.getByRole('button', { name: 'Did not arrive' }).click()
  await dialog.getByRole('button', { name: 'Withdraw', exact: true }).click()
  await expect(page.getByText(`${name} has withdrawn: Did not arrive.`)).toBeVisible()
  expect(await entryStatus()).toBe('withdrawn')
  await page.getByRole('link', { name: /^Check-in/ }).click()
  await page.getByRole('button', { name: 'Everyone', exact: true }).click()
  await page.getByRole('button', { name: `Take back the withdrawal of ${name}` }).click()
  await expect(page.getByText(`${name} is back in the tournament, checked in.`)).toBeVisible()
  await expect(page.getByRole('button', { name: `Take back the withdrawal of ${name}` })).toHaveCount(0)
  expect(await entryStatus()).toBe('checked-in')

  // The schedule: a column per ring, side by side on a wide screen, every pool match with its times.
  await page.goto(s.eventPage)
  await page.getByRole('link', { name: 'Schedule', exact: true }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Schedule' })).toBeVisible()
  const ring1 = page.getByRole('region', { name: 'Ring 1' })
  const ring2 = page.getByRole('region', { name: 'Ring 2' })
  await expect(ring1.getByRole('listitem')).toHaveCount(6)
  await expect(ring2.getByRole('listitem')).toHaveCount(6)
  await expect(ring1.getByRole('listitem').first()).toContainText(/\d\d:\d\d–\d\d:\d\d/)
  await expect(page.getByText('12 matches to fence', { exact: false })).toBeVisible()
  await expect(page.getByRole('heading', { name: 'How the times are estimated' })).toBeVisible()
  const [box1, box2] = [await ring1.boundingBox(), await ring2.boundingBox()]
  expect(box2!.x).toBeGreaterThan(box1!.x + box1!.width - 1)
  expect(Math.abs(box2!.y - box1!.y)).toBeLessThan(2)
  // On a tablet held upright the rings stack.
  await page.setViewportSize({ width: 800, height: 1100 })
  const [narrow1, narrow2] = [await ring1.boundingBox(), await ring2.boundingBox()]
  expect(narrow2!.y).toBeGreaterThan(narrow1!.y + narrow1!.height - 1)
  // A match links to its result form.
  await ring1.getByRole('link', { name: /^Result of / }).first().click()
  await expect(page).toHaveURL(/\/matches\/\d+$/)
})

test('a round-robin final is fenced to its places, the tournament closes only then, and the club site shows its table without JavaScript', async ({ page, browser }) => {
  test.setTimeout(120_000)
  const s = await setUp(page, 'round robin')
  const ruleSets = (await (await page.request.get(`/api/clubs/${s.clubId}/rule-sets`)).json()).ruleSets as { id: number, name: string }[]
  const created = await ok(await page.request.post(`/api/clubs/${s.clubId}/events/${s.eventId}/tournaments`, {
    data: { name: 'Sword and buckler', weapon: 'Sword and buckler', ruleSetId: ruleSets.find(r => r.name === s.ruleSetName)!.id, poolSize: 4, qualifyCount: 4, finalsFormat: 'round-robin' },
  }), 201) as { id: number }
  const api = `/api/clubs/${s.clubId}/events/${s.eventId}/tournaments/${created.id}`
  const tournamentPage = `${s.eventPage}/tournaments/${created.id}`
  await enterFighters(page.request, s.clubId, api)
  await fenceAll(page.request, api, await startPools(page.request, api))

  // Before the finals the page says what they will be.
  await page.goto(`${tournamentPage}/finals`)
  await expect(page.getByText(/fence the finals as a round robin/)).toBeVisible()
  await page.getByRole('button', { name: 'Start the finals…' }).click()
  const start = page.getByRole('dialog', { name: 'Start the finals?' })
  await expect(start.getByText(/a round robin, in which every finalist fences every other once/)).toBeVisible()
  await start.getByRole('button', { name: 'Start the finals' }).click()
  await expect(page.getByText('The finals have started: the finalists fence a round robin')).toBeVisible()

  // The final's table (no cut to show in a final) and its six matches in order, each with its result form.
  const table = page.getByRole('table', { name: 'Table of the round-robin final' })
  await expect(table.getByRole('row')).toHaveCount(5)
  await expect(table.getByRole('columnheader', { name: /Status/ })).toHaveCount(0)
  const matches = page.getByRole('region', { name: 'Matches' })
  await expect(matches.getByRole('link', { name: /^Enter result of match \d/ })).toHaveCount(6)
  await expect(page.getByText('6 final matches are still to be fenced or settled.').first()).toBeVisible()

  // Closing waits for the finals, and says why.
  await page.getByRole('button', { name: 'Close the tournament…' }).click()
  await page.getByRole('dialog', { name: 'Close the tournament?' }).getByRole('button', { name: 'Close the tournament' }).click()
  await expect(page.getByText('6 final matches are still to be fenced', { exact: true })).toBeVisible()

  // A final match opens its result form; the matches are fenced as the desks would send them.
  await matches.getByRole('link', { name: /^Enter result of match 1,/ }).click()
  await expect(page).toHaveURL(/\/matches\/\d+$/)
  const finals = await (await page.request.get(`${api}/bracket`)).json() as { matches: MatchRow[] }
  await fenceAll(page.request, api, finals.matches)
  await page.goto(`${tournamentPage}/finals`)
  await expect(page.getByText('The finals are decided. Close the tournament with the button above.')).toBeVisible()
  await expect(page.getByText('The finals are decided: close the tournament to make every result final.')).toBeVisible()
  const places = page.getByRole('region', { name: 'Places' })
  for (const place of ['First', 'Second', 'Third', 'Fourth']) await expect(places.getByText(place, { exact: true })).toBeVisible()
  await expect(page.getByRole('region', { name: 'Table of the final' }).getByText('Final', { exact: true })).toBeVisible()
  await page.getByRole('button', { name: 'Close the tournament…' }).click()
  await page.getByRole('dialog', { name: 'Close the tournament?' }).getByRole('button', { name: 'Close the tournament' }).click()
  await expect(page.getByText('The tournament is closed: every result is final.')).toBeVisible()

  // The club site, read without JavaScript: the final's table and its matches are in the page.
  const event = await ok(await page.request.post(`/api/clubs/${s.clubId}/events/${s.eventId}/publish`)) as { slug: string }
  const reader = await browser.newContext({ javaScriptEnabled: false })
  const site = await reader.newPage()
  await site.goto(`/site/${DEMO_CLUB}/events/${event.slug}`)
  const finalTable = site.getByRole('table', { name: 'Sword and buckler, table of the round-robin final' })
  await expect(finalTable.getByRole('row')).toHaveCount(5)
  await expect(site.getByText(/A round robin: every finalist fences every other once/)).toBeVisible()
  const siteFinals = site.getByRole('region', { name: 'Finals', exact: true })
  await expect(siteFinals.getByText('Matches of the final')).toBeVisible()
  await expect(siteFinals.getByText('6 of 6 done')).toBeVisible()
  await reader.close()
})
