import { expect, test, type APIRequestContext, type Locator, type Page } from '@playwright/test'
import { DEMO_CLUB, demo, signIn } from './support'

// Each test builds its own one-ring event in the demo club through the API (as the organizer) and
// the demo table keeps its desk; the demo event is never touched. Invented fighters and clubs.
const FIGHTERS = [
  ['Lowenna Trist', 'Ironquay Fencing Hall'],
  ['Hedra Penrose', 'Greyfield Sword Society'],
  ['Cadan Veor', 'Old Mill Fencing School'],
  ['Mabyn Colenso', 'Lanterngate Historical Fencing'],
] as const

interface Setup {
  clubId: number
  eventId: number
  eventName: string
  api: string
  desk: string
  organizer: APIRequestContext
}

interface StoredEntry { id: string, payload: { kind: string, id: string, targetId?: string } }
interface MatchDetail { match: { id: number, version: number, status: string }, entries: StoredEntry[], state: { finished: boolean, sides: { a: { points: number }, b: { points: number } } } }
interface Side { name: string }
interface RingLive { match: { id: number, sideA: Side, sideB: Side } | null, onDeck: { id: number, sideA: Side, sideB: Side } | null }

async function ok(res: Awaited<ReturnType<APIRequestContext['post']>>, status = 200) {
  expect(res.status(), await res.text()).toBe(status)
  return res.json()
}

/** A one-ring event with one pool of four, drawn, under the given rules (a preset, or settings changed from one). */
async function setUp(organizer: APIRequestContext, label: string, rules: { preset: string, change?: Record<string, unknown> }): Promise<Setup> {
  await ok(await organizer.post('/api/auth/sign-in', { data: demo.organizer }))
  const stamp = `${label}-${Date.now().toString(36)}`
  const account = await (await organizer.get('/api/account')).json() as { clubs: { id: number, slug: string }[] }
  const clubId = account.clubs.find(c => c.slug === DEMO_CLUB)!.id
  const presets = await (await organizer.get(`/api/clubs/${clubId}/rule-sets/presets`)).json() as { presets: { name: string, settings: Record<string, unknown> }[] }
  const preset = presets.presets.find(p => p.name === rules.preset)!.settings
  const ruleSet = await ok(await organizer.post(`/api/clubs/${clubId}/rule-sets`, {
    data: { name: `Desk rules ${stamp}`, settings: { ...preset, ...rules.change } },
  }), 201) as { id: number }
  const eventName = `Gullhaven Desk Trial ${stamp}`
  const event = await ok(await organizer.post(`/api/clubs/${clubId}/events`, {
    data: {
      name: eventName, slug: `gullhaven-desk-${stamp}`, startsOn: '2027-06-12', endsOn: '2027-06-12',
      venue: 'The Rope Walk, Gullhaven', rings: 1, emergencyNumber: '112', firstAidPoint: 'By the east door',
    },
  }), 201) as { id: number }
  const tournament = await ok(await organizer.post(`/api/clubs/${clubId}/events/${event.id}/tournaments`, {
    data: { name: 'Longsword', weapon: 'Longsword', ruleSetId: ruleSet.id, poolSize: 4, qualifyCount: 2 },
  }), 201) as { id: number }
  const api = `/api/clubs/${clubId}/events/${event.id}/tournaments/${tournament.id}`
  for (const [name, clubName] of FIGHTERS) {
    const created = await organizer.post(`/api/clubs/${clubId}/fighters`, { data: { name, clubName } })
    const fighterId = created.status() === 201
      ? (await created.json()).id as number
      : ((await (await organizer.get(`/api/clubs/${clubId}/fighters?q=${encodeURIComponent(name)}`)).json()).fighters as { id: number, clubName: string }[])
          .find(f => f.clubName === clubName)!.id
    const entry = await ok(await organizer.post(`${api}/entries`, { data: { fighterId, seed: null } }), 201) as { id: number }
    await ok(await organizer.post(`${api}/entries/${entry.id}/check-in`, { data: { kitChecked: true, weaponChecked: true } }))
  }
  await ok(await organizer.post(`${api}/phase`, { data: { to: 'pools' } }))
  await ok(await organizer.post(`${api}/pools/draw`, { data: { drawKey: stamp } }), 201)
  return { clubId, eventId: event.id, eventName, api, desk: `/clubs/${DEMO_CLUB}/desk/${event.id}/1`, organizer }
}

async function ringNow(s: Setup): Promise<RingLive> {
  return await ok(await s.organizer.get(`/api/clubs/${s.clubId}/events/${s.eventId}/rings/1`)) as RingLive
}

async function storedLog(s: Setup, matchId: number): Promise<MatchDetail> {
  return await ok(await s.organizer.get(`${s.api}/matches/${matchId}`)) as MatchDetail
}

const pad = (page: Page) => page.locator('section[aria-labelledby="desk-pad-heading"]')
const historyLines = (page: Page) => page.locator('section[aria-labelledby="log-heading"] li')

/** Taps the buttons in order, as a finger would, and answers how many taps that was. */
async function taps(...buttons: Locator[]): Promise<number> {
  for (const button of buttons) await button.click()
  return buttons.length
}

/** The table opens the ring's desk and calls the match on deck; answers the fighters' names. */
async function openAndCall(page: Page, s: Setup) {
  const onDeck = (await ringNow(s)).onDeck!
  await page.goto(s.desk)
  await expect(page.getByText('No match on this ring')).toBeVisible()
  await expect(page.getByTestId('on-deck')).toHaveText(`${onDeck.sideA.name} v ${onDeck.sideB.name}`)
  await page.getByRole('button', { name: `Call ${onDeck.sideA.name} v ${onDeck.sideB.name}` }).click()
  await expect(page.getByRole('region', { name: new RegExp(`Side A, Red: ${onDeck.sideA.name}`) })).toBeVisible()
  await expect(pad(page).getByRole('button', { name: `${onDeck.sideA.name} hit` })).toBeEnabled()
  await expect(page.getByTestId('desk-link')).toHaveText('Live')
  return { a: onDeck.sideA.name, b: onDeck.sideB.name, matchId: onDeck.id }
}

test('the table records bouts in three taps or fewer, undoes one, confirms the result and calls the next match', async ({ page, request }) => {
  test.setTimeout(90_000)
  const s = await setUp(request, 'taps', { preset: 'first-hit-three-bouts' })
  await signIn(page, demo.scorekeeper)

  // The list of the club's events with their rings leads to the desk.
  await page.goto(`/clubs/${DEMO_CLUB}/desk`)
  await page.getByRole('region', { name: s.eventName }).getByRole('link', { name: /Ring 1/ }).click()
  await expect(page).toHaveURL(new RegExp(`${s.desk}$`))
  const { a, b, matchId } = await openAndCall(page, s)
  const scores = async () => [await page.getByTestId('score-a').textContent(), await page.getByTestId('score-b').textContent()].map(t => t?.replace(/\D/g, ''))

  // A clean hit: who hit → where → no afterblow. The preset scores head 3, torso 2, arms 1.
  expect(await taps(
    pad(page).getByRole('button', { name: `${a} hit` }),
    pad(page).getByRole('button', { name: /^Head/ }),
    pad(page).getByRole('button', { name: /No afterblow/ }),
  )).toBe(3)
  await expect(historyLines(page)).toHaveCount(1)
  await expect(historyLines(page).first()).toContainText(`${a} hit: head, cut`)
  await expect.poll(scores).toEqual(['3', '0'])

  // A double: double → a's target → b's target (the preset scores doubles as nothing).
  expect(await taps(
    pad(page).getByRole('button', { name: /^Double/ }),
    pad(page).getByRole('button', { name: /^Torso/ }),
    pad(page).getByRole('button', { name: /^Arms/ }),
  )).toBe(3)
  await expect(historyLines(page).first()).toContainText('Double')
  await expect(page.locator('[data-kind="bout"]')).toHaveCount(2)

  // Undo takes the double back with a cancel entry; the history keeps both lines.
  await page.getByRole('button', { name: /^Undo/ }).click()
  await expect(historyLines(page).first()).toContainText('Taken back: Double')
  await expect(page.locator('[data-kind="bout"]')).toHaveCount(1)
  await expect(page.getByTestId('desk-outbox')).toHaveText('All entries saved')

  // Not seen: one tap, the bout is fenced again and shown as a repeat on the strip.
  expect(await taps(pad(page).getByRole('button', { name: /^Not seen/ }))).toBe(1)
  await expect(page.locator('[data-kind="again"]')).toHaveCount(1)

  // The keys do the same: B, 2 (torso), 0 (no afterblow).
  await page.keyboard.press('b')
  await expect(pad(page).getByRole('heading')).toContainText(`${b} hit: where?`)
  await page.keyboard.press('2')
  await page.keyboard.press('0')
  await expect(historyLines(page).first()).toContainText(`${b} hit: torso, cut`)
  await expect.poll(scores).toEqual(['3', '2'])

  // The third bout ends the match: an afterblow (a hit head, b answered on the arms); the desk asks first.
  expect(await taps(
    pad(page).getByRole('button', { name: `${a} hit` }),
    pad(page).getByRole('button', { name: /^Head/ }),
    pad(page).getByRole('button', { name: /^Arms/ }),
  )).toBe(3)
  const confirm = page.getByRole('alertdialog', { name: /This ends the match/ })
  await expect(confirm.getByTestId('result-preview')).toHaveText(`${a} wins 6–3 (all bouts fenced)`)
  // Nothing is sent before the table confirms.
  expect((await storedLog(s, matchId)).entries).toHaveLength(5)
  await page.keyboard.press('Enter')
  await expect(page.getByTestId('match-result')).toHaveText(`${a} wins 6–3 (all bouts fenced)`)
  await expect(pad(page)).toHaveCount(0)
  await expect(page.getByTestId('desk-outbox')).toHaveText('All entries saved')

  // The stored log: every entry once, the cancel naming the double, the match over.
  const log = await storedLog(s, matchId)
  expect(log.entries.map(e => e.payload.kind)).toEqual(['clean', 'double', 'cancel', 'void', 'clean', 'afterblow'])
  expect(log.entries[2]!.payload.targetId).toBe(log.entries[1]!.id)
  expect(new Set(log.entries.map(e => e.id)).size).toBe(6)
  expect(log.match.status).toBe('finished')
  expect([log.state.sides.a.points, log.state.sides.b.points]).toEqual([6, 3])

  // N calls the match on deck; the desk moves to it and shows the one after on deck.
  const next = (await ringNow(s)).onDeck!
  await page.keyboard.press('n')
  await expect(page.getByRole('region', { name: new RegExp(`Side A, Red: ${next.sideA.name}`) })).toBeVisible()
  await expect(page.getByRole('region', { name: new RegExp(`Side B, Blue: ${next.sideB.name}`) })).toBeVisible()
  expect((await ringNow(s)).match?.id).toBe(next.id)
  await expect(page.getByTestId('on-deck')).not.toHaveText(`${next.sideA.name} v ${next.sideB.name}`)
})

test('a black card and a card from the keys: the black one is confirmed before it ends the match', async ({ page, request }) => {
  const s = await setUp(request, 'cards', { preset: 'first-hit-three-bouts' })
  await signIn(page, demo.scorekeeper)
  const { a, b, matchId } = await openAndCall(page, s)

  // C → A → Y: a yellow card for side a, from the keys.
  await page.keyboard.press('c')
  await page.keyboard.press('a')
  await page.keyboard.press('y')
  await expect(historyLines(page).first()).toContainText(`Yellow card for ${a}`)
  await expect(page.getByRole('region', { name: new RegExp(`Side A, Red: ${a}`) }).getByRole('list', { name: 'Cards' })).toHaveText('Yellow')

  // A black card: two taps, then the desk asks in plain words; taking it back sends nothing.
  await pad(page).getByRole('button', { name: /^Card/ }).click()
  await pad(page).getByRole('button', { name: `Black for ${b}` }).click()
  const ask = page.getByRole('alertdialog', { name: `Black card for ${b}: expel?` })
  await expect(ask).toContainText(`${a} wins 0–0 (black card)`)
  await ask.getByRole('button', { name: /Not yet/ }).click()
  await expect(ask).toHaveCount(0)
  expect((await storedLog(s, matchId)).entries).toHaveLength(1)

  await pad(page).getByRole('button', { name: /^Card/ }).click()
  await pad(page).getByRole('button', { name: `Black for ${b}` }).click()
  await ask.getByRole('button', { name: 'Expel and end the match' }).click()
  await expect(page.getByTestId('match-result')).toHaveText(`${a} wins 0–0 (black card)`)
  await expect(page.getByTestId('desk-outbox')).toHaveText('All entries saved')
  const log = await storedLog(s, matchId)
  expect(log.entries.map(e => e.payload.kind)).toEqual(['card', 'card'])
  expect(log.match.status).toBe('finished')
})

for (const size of [{ width: 1280, height: 800 }, { width: 800, height: 1280 }]) {
  test(`at ${size.width}×${size.height}, a 10-inch tablet, nothing overflows and every pad button is a large touch target`, async ({ page, request }) => {
    const s = await setUp(request, `tablet-${size.width}`, { preset: 'points-to-seven', change: { targets: { head: { allowed: true, cut: 3, thrust: 4 }, torso: { allowed: true, cut: 2, thrust: 2 }, arms: { allowed: true, cut: 1, thrust: 1 }, hands: { allowed: true, cut: 1, thrust: 1 }, legs: { allowed: true, cut: 1, thrust: 1 } } } })
    await page.setViewportSize(size)
    await signIn(page, demo.scorekeeper)
    const { a } = await openAndCall(page, s)

    // WCAG 2.2 success criterion 2.5.5, Target Size (Enhanced): at least 44 by 44 CSS pixels.
    const check = async (step: string) => {
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
      expect(overflow, `${step}: the page scrolls sideways`).toBeLessThanOrEqual(0)
      for (const button of await pad(page).getByRole('button').all()) {
        const box = (await button.boundingBox())!
        expect(box.x, `${step}: ${await button.textContent()}`).toBeGreaterThanOrEqual(0)
        expect(box.x + box.width, `${step}: ${await button.textContent()}`).toBeLessThanOrEqual(size.width)
        expect(box.height, `${step}: ${await button.textContent()}`).toBeGreaterThanOrEqual(44)
        expect(box.width, `${step}: ${await button.textContent()}`).toBeGreaterThanOrEqual(44)
      }
    }
    await check('start')
    // The first buttons of the pad are on screen without scrolling.
    const first = (await pad(page).getByRole('button', { name: `${a} hit` }).boundingBox())!
    expect(first.y + first.height).toBeLessThanOrEqual(size.height)
    await pad(page).getByRole('button', { name: `${a} hit` }).click()
    // Head scores a thrust apart from a cut here, so it has two buttons; torso has one.
    await expect(pad(page).getByRole('button', { name: /^Head · thrust/ })).toBeVisible()
    await expect(pad(page).getByRole('button', { name: /^Torso/ })).toHaveCount(1)
    await check('where')
    await page.keyboard.press('Escape')
    await pad(page).getByRole('button', { name: /^Card/ }).click()
    await check('card')
    await expect(page.getByRole('heading', { name: 'Keys' })).toBeVisible()
  })
}

test('offline, entries wait in a queue that shows its count and survives a reload, then arrive exactly once', async ({ page, context, request }) => {
  test.setTimeout(90_000)
  const s = await setUp(request, 'offline', { preset: 'first-hit-three-bouts' })
  await signIn(page, demo.scorekeeper)
  const { b, matchId } = await openAndCall(page, s)

  await page.keyboard.press('a')
  await page.keyboard.press('2')
  await page.keyboard.press('0')
  await expect(page.getByTestId('desk-outbox')).toHaveText('All entries saved')

  await context.setOffline(true)
  await expect(page.getByTestId('desk-link')).toHaveText('Offline')
  await page.keyboard.press('s')
  await page.keyboard.press('b')
  await page.keyboard.press('1')
  await page.keyboard.press('0')
  await expect(page.getByTestId('desk-outbox')).toContainText('2 entries not sent')
  await expect(page.getByTestId('unsent-note')).toBeVisible()
  await expect(page.getByTestId('score-b')).toContainText('3')
  const queued = await page.evaluate(() => Object.keys(localStorage).filter(k => k.startsWith('unscathed.desk.')).map(k => JSON.parse(localStorage.getItem(k)!).entries.map((e: { id: string }) => e.id)).flat())
  expect(queued).toHaveLength(2)
  expect((await storedLog(s, matchId)).entries).toHaveLength(1)

  // A reload without network: the desk's offline copy opens, with the queue and its count.
  await page.reload()
  await expect(page.getByTestId('desk-outbox')).toContainText('2 entries not sent')
  await expect(page.getByTestId('score-a')).toContainText('2')
  await expect(page.getByTestId('score-b')).toContainText('3')
  await expect(historyLines(page).first()).toContainText(`${b} hit: head, cut`)

  // Back online, the first answer is lost after the server stored the batch: the desk sends it
  // again, and the server keeps each id once.
  const lost: number[] = []
  await page.route('**/matches/*/entries', async (route) => {
    lost.push((await route.fetch()).status())
    await route.abort('failed')
  }, { times: 1 })
  await context.setOffline(false)
  await expect(page.getByTestId('desk-outbox')).toHaveText('All entries saved', { timeout: 15_000 })
  expect(lost).toEqual([201])

  const log = await storedLog(s, matchId)
  expect(log.entries.map(e => e.payload.kind)).toEqual(['clean', 'void', 'clean'])
  expect(log.entries.slice(1).map(e => e.id)).toEqual(queued)
  await expect(page.getByTestId('score-b')).toContainText('3')
  expect(await page.evaluate(() => Object.keys(localStorage).filter(k => k.startsWith('unscathed.desk.')))).toEqual([])
})

test('two desks on one match: the later one gets a conflict with the current state and chooses', async ({ page, browser, request }) => {
  test.setTimeout(90_000)
  const s = await setUp(request, 'conflict', { preset: 'first-hit-three-bouts' })
  await signIn(page, demo.scorekeeper)
  const { a, b, matchId } = await openAndCall(page, s)

  const otherContext = await browser.newContext()
  const other = await otherContext.newPage()
  await signIn(other, demo.organizer)
  await other.goto(s.desk)
  await expect(other.getByRole('region', { name: new RegExp(`Side A, Red: ${a}`) })).toBeVisible()
  await expect(other.getByTestId('desk-link')).toHaveText('Live')
  await expect(pad(other).getByRole('button', { name: `${a} hit` })).toBeEnabled()

  // The second desk records while cut off; the first records meanwhile.
  await otherContext.setOffline(true)
  await other.keyboard.press('b')
  await other.keyboard.press('3')
  await other.keyboard.press('0')
  await expect(other.getByTestId('desk-outbox')).toContainText('1 entry not sent')
  await page.keyboard.press('a')
  await page.keyboard.press('1')
  await page.keyboard.press('0')
  await expect(page.getByTestId('desk-outbox')).toHaveText('All entries saved')

  await otherContext.setOffline(false)
  const conflict = other.getByRole('alert').filter({ hasText: 'Another desk changed' })
  await expect(conflict).toContainText(`Another desk changed ${a} v ${b} while 1 entry waited here.`)
  await expect(conflict).toContainText('On the server it now stands at 3–0 after 1 bout')
  await expect(conflict).toContainText('With yours on top it would stand at 3–1')
  await expect(conflict).toContainText(`${b} hit: arms, cut`)
  // Nothing was written over: the server holds only the first desk's bout, and the pad waits.
  expect((await storedLog(s, matchId)).entries.map(e => e.payload.kind)).toEqual(['clean'])
  await expect(pad(other).getByRole('button', { name: `${a} hit` })).toBeDisabled()

  await conflict.getByRole('button', { name: 'Send mine on top' }).click()
  await expect(other.getByTestId('desk-outbox')).toHaveText('All entries saved')
  await expect(conflict).toHaveCount(0)
  const log = await storedLog(s, matchId)
  expect(log.entries.map(e => e.payload.kind)).toEqual(['clean', 'clean'])
  await expect(page.getByTestId('score-b')).toContainText('1')

  // Again, and this time the second desk discards its entry: the server's log stays as it is.
  await otherContext.setOffline(true)
  await other.keyboard.press('s')
  await page.keyboard.press('v')
  await expect(page.getByTestId('desk-outbox')).toHaveText('All entries saved')
  await otherContext.setOffline(false)
  await conflict.getByRole('button', { name: 'Discard mine' }).click()
  await expect(other.getByTestId('desk-outbox')).toHaveText('All entries saved')
  const after = await storedLog(s, matchId)
  expect(after.entries.map(e => (e.payload as { reason?: string }).reason ?? e.payload.kind)).toEqual(['clean', 'clean', 'no-valid-hit'])
  await otherContext.close()
})

test('a desk calling from an old view of its ring is told which match another desk called', async ({ page, request }) => {
  const s = await setUp(request, 'call', { preset: 'first-hit-three-bouts' })
  await signIn(page, demo.scorekeeper)
  // This desk gets no live updates at all: it knows only what it loads and what its own writes answer.
  await page.route('**/live/clubs/**', route => route.abort())
  const first = (await ringNow(s)).onDeck!
  await page.goto(s.desk)
  await page.getByRole('button', { name: `Call ${first.sideA.name} v ${first.sideB.name}` }).click()
  await expect(pad(page).getByRole('button', { name: `${first.sideA.name} hit` })).toBeEnabled()
  for (const key of ['a', '1', '0', 'a', '1', '0', 'a', '1', '0']) await page.keyboard.press(key)
  await page.keyboard.press('Enter')
  await expect(page.getByTestId('match-result')).toHaveText(`${first.sideA.name} wins 9–0 (all bouts fenced)`)
  await expect(page.getByTestId('desk-outbox')).toHaveText('All entries saved')

  // Another desk calls the match on deck; this one, not knowing, calls it too.
  const next = (await ringNow(s)).onDeck!
  const rings = await ok(await s.organizer.get(`/api/clubs/${s.clubId}/events/${s.eventId}/rings`)) as { rings: { version: number }[] }
  await ok(await s.organizer.post(`/api/clubs/${s.clubId}/events/${s.eventId}/rings/1/call`, { data: { matchId: next.id, expectedVersion: rings.rings[0]!.version } }))
  await page.keyboard.press('n')
  await expect(page.getByText(`Another desk called ${next.sideA.name} v ${next.sideB.name} (Longsword, pool 1) to ring 1 first. This desk now shows it.`)).toBeVisible()
  await expect(page.getByRole('region', { name: new RegExp(`Side A, Red: ${next.sideA.name}`) })).toBeVisible()
  expect((await ringNow(s)).match?.id).toBe(next.id)
})

test('the points format: the server\'s clock, the last-exchange warning and the time-up prompt', async ({ page, request }) => {
  test.setTimeout(90_000)
  const s = await setUp(request, 'clock', { preset: 'points-to-seven', change: { timeLimitSeconds: 30 } })
  await signIn(page, demo.scorekeeper)
  const { a, matchId } = await openAndCall(page, s)
  const clock = page.getByTestId('clock')
  await expect(clock).toHaveText('0:30')

  await page.keyboard.press(' ')
  await expect(page.getByText('Running', { exact: true })).toBeVisible()
  await expect.poll(async () => (await clock.textContent())?.trim()).not.toBe('0:30')
  await page.keyboard.press(' ')
  await expect(page.getByText('Stopped', { exact: true })).toBeVisible()

  // −5 s twice takes ten seconds off the time left (the server moves the time run on).
  const before = await storedLog(s, matchId)
  await page.getByRole('button', { name: 'Take 5 s off the time left' }).click()
  await page.getByRole('button', { name: 'Take 5 s off the time left' }).click()
  await page.getByRole('button', { name: 'Take 5 s off the time left' }).click()
  await page.getByRole('button', { name: 'Take 5 s off the time left' }).click()
  await expect(page.getByRole('status').filter({ hasText: 'Last exchange' })).toBeVisible()
  expect((await storedLog(s, matchId)).match.version).toBeGreaterThan(before.match.version)

  // An exchange recorded after the clock moved goes through with the version the desk saw.
  await page.keyboard.press('a')
  await page.keyboard.press('2')
  await page.keyboard.press('0')
  await expect(historyLines(page).first()).toContainText(`${a} hit: torso, cut`)
  await expect(page.getByTestId('desk-outbox')).toHaveText('All entries saved')

  // The last seconds run out: the desk prompts for time-up and asks to confirm the result.
  await page.keyboard.press(' ')
  await expect(page.getByRole('alert').filter({ hasText: 'Time is up' })).toBeVisible({ timeout: 15_000 })
  await page.getByRole('button', { name: /Record time-up/ }).click()
  const confirm = page.getByRole('alertdialog', { name: /This ends the match/ })
  await expect(confirm.getByTestId('result-preview')).toHaveText(`${a} wins 2–0 (time up)`)
  await confirm.getByRole('button', { name: /Confirm the result/ }).click()
  await expect(page.getByTestId('match-result')).toHaveText(`${a} wins 2–0 (time up)`)
  const log = await storedLog(s, matchId)
  expect(log.entries.map(e => e.payload.kind)).toEqual(['clean', 'time-up'])
  expect(log.match.status).toBe('finished')
})

test('a bout tapped on the desk shows on the ring\'s overlay within one second', async ({ page, browser, request }) => {
  const s = await setUp(request, 'to-overlay', { preset: 'first-hit-three-bouts' })
  const rings = await ok(await s.organizer.get(`/api/clubs/${s.clubId}/events/${s.eventId}/rings`)) as { rings: { overlay: { path: string } }[] }
  await signIn(page, demo.scorekeeper)
  const { a } = await openAndCall(page, s)

  // The recording software's browser source: no session, only the overlay address.
  const source = await browser.newContext({ viewport: { width: 1920, height: 1080 } })
  const overlay = await source.newPage()
  await overlay.goto(rings.rings[0]!.overlay.path)
  await expect(overlay.locator('[data-overlay-canvas]')).toHaveAttribute('data-board', 'bout')
  await expect(overlay.locator('.ov-window')).toHaveAttribute('data-status', 'live')
  await expect(overlay.locator('[data-name="a"]')).toHaveText(a)
  await expect(overlay.locator('[data-score="a"]')).toHaveText('0')

  await pad(page).getByRole('button', { name: `${a} hit` }).click()
  await pad(page).getByRole('button', { name: /^Head/ }).click()
  const tapped = Date.now()
  await pad(page).getByRole('button', { name: /No afterblow/ }).click()
  // The preset scores a head cut 3 (first-hit preset, common practice, no source).
  await expect(overlay.locator('[data-score="a"]')).toHaveText('3', { timeout: 1000 })
  expect(Date.now() - tapped).toBeLessThan(1000)
  await source.close()
})
