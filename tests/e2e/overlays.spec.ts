import { expect, request as requests, test } from '@playwright/test'
import type { APIRequestContext, APIResponse, Page } from '@playwright/test'
import { contrastRatio } from '../../shared/utils/contrast'
import { freePort, startSecondApp } from '../support/app'
import type { SecondApp } from '../support/app'
import { DEMO_CLUB, demo, signIn } from './support'

// Each test makes its own rule set, one-ring event and fighters in the demo club through the API,
// and touches nothing else. Invented fighters of the demo scenario's invented clubs.
const BASE = process.env.BASE_URL ?? 'http://127.0.0.1:3100'
const FIGHTERS = [
  ['Wenna Trego', 'Ironquay Fencing Hall'],
  ['Caspar Lowry', 'North Downs Buckler Circle'],
  ['Ebrel Kitto', 'Lanterngate Historical Fencing'],
  ['Morwen Pascoe', 'Greyfield Sword Society'],
  ['Tobias Quiller', 'Old Mill Fencing School'],
] as const

// EBU R 95 (2008), "Safe areas for 16:9 television production": the graphics-safe area is 90 % of
// the picture's width and height, centred; on 1920 × 1080 that is x 96–1824, y 54–1026.
const GRAPHICS_SAFE = { left: 96, top: 54, right: 1824, bottom: 1026 }
// WCAG 2.2, Success Criterion 1.4.3 (AA): text needs 4.5:1 against what is behind it.
const WCAG_AA = 4.5

interface MatchRow { id: number, order: number, version: number, status: string, sideA: { name: string } | null, sideB: { name: string } | null }
interface Setup {
  clubId: number
  eventId: number
  api: string
  rings: string
  overlay: string
  matches: MatchRow[]
}

async function ok(res: APIResponse, status = 200) {
  expect(res.status(), await res.text()).toBe(status)
  return res.json()
}

/** A request context signed in as one of the demo's people. */
async function signedIn(who: { email: string, password: string }): Promise<APIRequestContext> {
  const context = await requests.newContext({ baseURL: BASE })
  await ok(await context.post('/api/auth/sign-in', { data: who }))
  return context
}

/** A one-ring event with a first-hit tournament (three bouts a match) in its pools, drawn. */
async function makeEvent(organizer: APIRequestContext, label: string, fighters = 5): Promise<Setup> {
  const stamp = `${label}-${Date.now().toString(36)}-${Math.floor(Math.random() * 1e4)}`
  const account = await ok(await organizer.get('/api/account')) as { clubs: { id: number, slug: string }[] }
  const clubId = account.clubs.find(c => c.slug === DEMO_CLUB)!.id
  const ruleSet = await ok(await organizer.post(`/api/clubs/${clubId}/rule-sets`, { data: { name: `Broadcast rules ${stamp}`, preset: 'first-hit-three-bouts' } }), 201) as { id: number }
  const event = await ok(await organizer.post(`/api/clubs/${clubId}/events`, {
    data: {
      name: `Harbour Lights Open ${stamp}`, slug: `harbour-lights-${stamp}`, startsOn: '2027-06-19', endsOn: '2027-06-19',
      venue: 'The Sail Loft, Wrenmouth', rings: 1, emergencyNumber: '112', firstAidPoint: 'Beside the ring, by the door',
    },
  }), 201) as { id: number }
  const tournament = await ok(await organizer.post(`/api/clubs/${clubId}/events/${event.id}/tournaments`, {
    data: { name: 'Sword and buckler', weapon: 'Sword and buckler', ruleSetId: ruleSet.id, poolSize: fighters, qualifyCount: 4 },
  }), 201) as { id: number }
  const api = `/api/clubs/${clubId}/events/${event.id}/tournaments/${tournament.id}`
  for (const [name, clubName] of FIGHTERS.slice(0, fighters)) {
    const created = await organizer.post(`/api/clubs/${clubId}/fighters`, { data: { name, clubName } })
    const fighterId = created.status() === 201
      ? (await created.json()).id as number
      : ((await ok(await organizer.get(`/api/clubs/${clubId}/fighters?q=${encodeURIComponent(name)}`))).fighters as { id: number, clubName: string }[])
          .find(f => f.clubName === clubName)!.id
    const entry = await ok(await organizer.post(`${api}/entries`, { data: { fighterId, seed: null } }), 201) as { id: number }
    await ok(await organizer.post(`${api}/entries/${entry.id}/check-in`, { data: { kitChecked: true, weaponChecked: true } }))
  }
  await ok(await organizer.post(`${api}/phase`, { data: { to: 'pools' } }))
  const drawn = await ok(await organizer.post(`${api}/pools/draw`, { data: { drawKey: stamp } }), 201) as { pools: { matches: MatchRow[] }[] }
  const rings = `/api/clubs/${clubId}/events/${event.id}/rings`
  const view = await ok(await organizer.get(rings)) as { rings: { overlay: { path: string } }[] }
  return {
    clubId, eventId: event.id, api, rings,
    overlay: view.rings[0]!.overlay.path,
    matches: drawn.pools.flatMap(p => p.matches).sort((a, b) => a.order - b.order),
  }
}

type Score = { a: number, b: number }

/** Posts bouts through the ring desk's route, each a clean torso cut by the side named; answers the score the server derived. */
async function fence(desk: APIRequestContext, s: Setup, matchId: number, sides: ('a' | 'b')[]): Promise<Score> {
  const { match } = await ok(await desk.get(`${s.api}/matches/${matchId}`)) as { match: { version: number } }
  const entries = sides.map(side => ({ id: crypto.randomUUID(), kind: 'clean', side, target: 'torso', action: 'cut' }))
  const stored = await ok(await desk.post(`${s.api}/matches/${matchId}/entries`, { data: { expectedVersion: match.version, entries } }), 201) as { match: { score: Score } }
  return stored.match.score
}

/** Calls a match to ring 1, as its desk does. */
async function call(desk: APIRequestContext, s: Setup, matchId: number) {
  const view = await ok(await desk.get(s.rings)) as { rings: { version: number }[] }
  await ok(await desk.post(`${s.rings}/1/call`, { data: { matchId, expectedVersion: view.rings[0]!.version } }))
}

/** The first match won by side a, two bouts to one; the second called, with one bout to side a. */
async function ringUnderWay(organizer: APIRequestContext, table: APIRequestContext, label: string) {
  const s = await makeEvent(organizer, label)
  const [first, second] = s.matches
  const firstScore = await fence(organizer, s, first!.id, ['a', 'a', 'b'])
  await call(organizer, s, second!.id)
  const score = await fence(table, s, second!.id, ['a'])
  expect(firstScore.a).toBeGreaterThan(firstScore.b)
  expect(score.a).toBeGreaterThan(0)
  expect(score.b).toBe(0)
  return { s, first: first!, second: second!, firstScore, score }
}

interface Measured {
  boxes: { what: string, left: number, top: number, right: number, bottom: number }[]
  texts: { what: string, text: string, color: string, colorAlpha: number, panel: string | null, panelAlpha: number }[]
}

/** Every element of the canvas as painted (clipped by ancestors that hide overflow), and every text with the panel behind it. */
function measure(page: Page): Promise<Measured> {
  return page.evaluate(() => {
    const canvas = document.querySelector('[data-overlay-canvas]')!
    const parse = (css: string) => {
      const n = (css.match(/[\d.]+/g) ?? []).map(Number)
      return { hex: `#${n.slice(0, 3).map(v => Math.round(v).toString(16).padStart(2, '0')).join('')}`, alpha: n.length > 3 ? n[3]! : 1 }
    }
    const describe = (el: Element) => `${el.tagName.toLowerCase()}.${[...el.classList].join('.')} "${(el.textContent ?? '').trim().slice(0, 30)}"`
    const out: Measured = { boxes: [], texts: [] }
    for (const el of canvas.querySelectorAll('*')) {
      const r = el.getBoundingClientRect()
      if (r.width === 0 || r.height === 0) continue
      let { left, top, right, bottom } = r
      for (let a = el.parentElement; a && a !== canvas; a = a.parentElement) {
        const style = getComputedStyle(a)
        if (style.overflowX === 'visible' && style.overflowY === 'visible') continue
        const c = a.getBoundingClientRect()
        left = Math.max(left, c.left)
        top = Math.max(top, c.top)
        right = Math.min(right, c.right)
        bottom = Math.min(bottom, c.bottom)
      }
      if (right <= left || bottom <= top) continue
      out.boxes.push({ what: describe(el), left, top, right, bottom })
      const text = [...el.childNodes].filter(n => n.nodeType === Node.TEXT_NODE).map(n => n.textContent ?? '').join('').trim()
      if (!text) continue
      const color = parse(getComputedStyle(el).color)
      let panel: { hex: string, alpha: number } | null = null
      for (let a: Element | null = el; a && a !== canvas.parentElement; a = a.parentElement) {
        const bg = parse(getComputedStyle(a).backgroundColor)
        if (bg.alpha > 0) {
          panel = bg
          break
        }
      }
      out.texts.push({ what: describe(el), text, color: color.hex, colorAlpha: color.alpha, panel: panel?.hex ?? null, panelAlpha: panel?.alpha ?? 0 })
    }
    return out
  })
}

async function openBoard(page: Page, url: string, board: string) {
  await page.goto(url)
  await expect(page.locator('[data-overlay-canvas]')).toHaveAttribute('data-board', board)
  await page.evaluate(() => document.fonts.ready.then(() => undefined))
}

test.describe('the boards on a 1920 × 1080 canvas', () => {
  let pools: Setup
  let finals: Setup
  let names: { first: MatchRow, second: MatchRow }

  test.beforeAll(async () => {
    test.setTimeout(90_000)
    const organizer = await signedIn(demo.organizer)
    const table = await signedIn(demo.scorekeeper)
    const ring = await ringUnderWay(organizer, table, 'boards')
    pools = ring.s
    names = ring
    // A second event in its finals: every pool match fenced, then one semifinal.
    finals = await makeEvent(organizer, 'bracket', 4)
    for (const m of finals.matches) await fence(organizer, finals, m.id, ['a', 'b', 'a'])
    await ok(await organizer.post(`${finals.api}/phase`, { data: { to: 'finals' } }))
    const bracket = await ok(await organizer.get(`${finals.api}/bracket`)) as { matches: { id: number, status: string }[] }
    await fence(organizer, finals, bracket.matches.find(m => m.status === 'scheduled')!.id, ['b', 'b', 'a'])
    await organizer.dispose()
    await table.dispose()
  })

  for (const board of ['bout', 'up-next', 'pool', 'bracket', 'winner'] as const) {
    test(`the ${board} board lies inside the EBU R 95 graphics-safe area and its text passes WCAG 2.2 contrast`, async ({ page }) => {
      await page.setViewportSize({ width: 1920, height: 1080 })
      await page.emulateMedia({ reducedMotion: 'reduce' })
      const s = board === 'bracket' ? finals : pools
      await openBoard(page, `${s.overlay}?board=${board}`, board)
      const m = await measure(page)

      // Not an empty pass: the board drew panels and words.
      expect(m.boxes.length).toBeGreaterThan(8)
      expect(m.texts.length).toBeGreaterThan(3)
      if (board === 'bout' || board === 'pool') expect(m.texts.map(t => t.text).join(' ')).toContain(names.second.sideA!.name)

      // EBU R 95: every element inside x 96–1824, y 54–1026 (half a pixel for rounding).
      const outside = m.boxes.filter(b => b.left < GRAPHICS_SAFE.left - 0.5 || b.top < GRAPHICS_SAFE.top - 0.5
        || b.right > GRAPHICS_SAFE.right + 0.5 || b.bottom > GRAPHICS_SAFE.bottom + 0.5)
      expect(outside, 'elements outside the EBU R 95 graphics-safe area').toEqual([])

      // WCAG 2.2 (1.4.3): each text, in its computed colour, against the opaque panel it sits on.
      const failing = m.texts.filter(t => t.colorAlpha < 1 || t.panel === null || t.panelAlpha < 1 || contrastRatio(t.color, t.panel) < WCAG_AA)
        .map(t => ({ ...t, ratio: t.panel ? contrastRatio(t.color, t.panel).toFixed(2) : 'no panel' }))
      expect(failing, 'texts under 4.5:1 against their own panel (WCAG 2.2 AA)').toEqual([])
    })
  }

  test('the overlay page loads at most 100 KB of JavaScript (gzip, as transferred), without zod or the rule engine', async () => {
    const html = await (await fetch(`${BASE}${pools.overlay}`)).text()
    const scripts = new Set([...html.matchAll(/<(?:script[^>]+src|link[^>]+rel="modulepreload"[^>]+href)="([^"]+\.js)"/g)].map(m => m[1]!))
    expect(scripts.size).toBeGreaterThan(0)
    let transferred = 0
    for (const src of scripts) {
      const res = await fetch(new URL(src, BASE), { headers: { 'accept-encoding': 'gzip' } })
      const code = await res.text()
      // fetch unpacks the body; the header keeps the size that travelled.
      transferred += Number(res.headers.get('content-length')) || Buffer.byteLength(code)
      // Names the minifier keeps: zod's internals, and the rule engine's match state.
      expect(code, src).not.toContain('_zod')
      expect(code, src).not.toContain('unharmedBouts')
    }
    expect(transferred).toBeLessThanOrEqual(100 * 1024)
  })

  test('the page is transparent, shows no cursor, ships Oswald itself, and scales the whole canvas to 1280 × 720 and 3840 × 2160 without scrollbars', async ({ browser }) => {
    const sizes = [[1920, 1080], [1280, 720], [3840, 2160]] as const
    const bars: { x: number, y: number, width: number, height: number }[] = []
    for (const [width, height] of sizes) {
      const page = await browser.newPage({ viewport: { width, height } })
      const fonts: string[] = []
      page.on('response', (res) => {
        if (/\.woff2?$/.test(new URL(res.url()).pathname)) fonts.push(res.url())
      })
      await page.emulateMedia({ reducedMotion: 'reduce' })
      await openBoard(page, `${pools.overlay}?board=bout`, 'bout')
      const canvas = (await page.locator('[data-overlay-canvas]').boundingBox())!
      for (const [got, want] of [[canvas.x, 0], [canvas.y, 0], [canvas.width, width], [canvas.height, height]]) expect(got).toBeCloseTo(want!, 0)
      bars.push((await page.getByLabel('Bout bar').boundingBox())!)
      const look = await page.evaluate(() => {
        const root = document.documentElement
        const name = document.querySelector('[data-name="a"]')!
        return {
          scrolls: root.scrollWidth > root.clientWidth || root.scrollHeight > root.clientHeight || document.body.scrollHeight > root.clientHeight,
          background: [getComputedStyle(root).backgroundColor, getComputedStyle(document.body).backgroundColor],
          cursor: getComputedStyle(name).cursor,
          font: getComputedStyle(name).fontFamily,
          oswald: document.fonts.check('600 44px Oswald'),
        }
      })
      expect(look.scrolls).toBe(false)
      expect(look.background).toEqual(['rgba(0, 0, 0, 0)', 'rgba(0, 0, 0, 0)'])
      expect(look.cursor).toBe('none')
      expect(look.font).toMatch(/^Oswald/)
      expect(look.oswald).toBe(true)
      expect(fonts.length).toBeGreaterThan(0)
      for (const url of fonts) expect(new URL(url).origin).toBe(new URL(BASE).origin)
      await page.close()
    }
    // The same layout, scaled: no element moves relative to the canvas.
    for (const [i, [width]] of sizes.entries()) {
      const k = width / 1920
      expect(bars[i]!.x).toBeCloseTo(bars[0]!.x * k, 0)
      expect(bars[i]!.y).toBeCloseTo(bars[0]!.y * k, 0)
      expect(bars[i]!.width).toBeCloseTo(bars[0]!.width * k, 0)
    }
  })
})

test('the overlay shows a bout within one second of the table posting it through the desk route', async ({ page }) => {
  const organizer = await signedIn(demo.organizer)
  const table = await signedIn(demo.scorekeeper)
  const { s, second, score } = await ringUnderWay(organizer, table, 'one-second')
  await page.goto(s.overlay)
  await expect(page.locator('[data-overlay-canvas]')).toHaveAttribute('data-board', 'bout')
  await expect(page.locator('.ov-window')).toHaveAttribute('data-status', 'live')
  await expect(page.locator('[data-name="a"]')).toHaveText(second.sideA!.name)
  await expect(page.locator('[data-name="b"]')).toHaveText(second.sideB!.name)
  await expect(page.locator('[data-score="a"]')).toHaveText(String(score.a))
  await expect(page.locator('[data-score="b"]')).toHaveText(String(score.b))

  const sent = Date.now()
  const after = await fence(table, s, second.id, ['b'])
  expect(after.b).toBeGreaterThan(score.b)
  await expect(page.locator('[data-score="b"]')).toHaveText(String(after.b), { timeout: Math.max(1, 1000 - (Date.now() - sent)) })
  expect(Date.now() - sent).toBeLessThan(1000)
  await organizer.dispose()
  await table.dispose()
})

test('a rotated overlay address is refused: an open overlay shows a notice, and so does a fresh load', async ({ page, browser }) => {
  const organizer = await signedIn(demo.organizer)
  const table = await signedIn(demo.scorekeeper)
  const { s } = await ringUnderWay(organizer, table, 'rotate')
  await page.goto(s.overlay)
  await expect(page.locator('.ov-window')).toHaveAttribute('data-status', 'live')
  await expect(page.locator('[data-overlay-canvas]')).toHaveAttribute('data-board', 'bout')

  const rotated = await ok(await organizer.post(`${s.rings}/1/token`)) as { overlay: { path: string } }
  expect(rotated.overlay.path).not.toBe(s.overlay)
  await expect(page.getByRole('alert')).toHaveText(/This overlay address was replaced/, { timeout: 10_000 })
  await expect(page.locator('[data-overlay-canvas]')).toHaveAttribute('data-board', 'notice')

  const token = s.overlay.split('/').pop()
  expect((await organizer.get(`/api/overlay/${token}`)).status()).toBe(404)
  const fresh = await browser.newContext({ javaScriptEnabled: false })
  const reload = await fresh.newPage()
  await reload.goto(s.overlay)
  await expect(reload.getByRole('alert')).toHaveText(/This overlay address was replaced/)
  await fresh.close()

  // The new address works.
  await page.goto(rotated.overlay.path)
  await expect(page.locator('[data-overlay-canvas]')).toHaveAttribute('data-board', 'bout')
  await organizer.dispose()
  await table.dispose()
})

test.describe('with app processes of its own', () => {
  // Nitro waits up to 30 s for open connections when it stops, and an overlay's stream stays open.
  const QUICK_STOP = { NITRO_SHUTDOWN_TIMEOUT: '1000' }
  const apps: SecondApp[] = []
  test.afterEach(async () => {
    await Promise.all(apps.splice(0).map(app => app.stop()))
  })

  test('after a server restart the overlay reconnects by itself and shows the bout posted while it was down', async ({ page }) => {
    test.setTimeout(90_000)
    const organizer = await signedIn(demo.organizer)
    const table = await signedIn(demo.scorekeeper)
    const { s, second, score } = await ringUnderWay(organizer, table, 'restart')
    const port = await freePort()
    let app = await startSecondApp(QUICK_STOP, port)
    apps.push(app)
    await page.goto(`${app.url}${s.overlay}`)
    await expect(page.locator('.ov-window')).toHaveAttribute('data-status', 'live')
    await expect(page.locator('[data-score="a"]')).toHaveText(String(score.a))

    await app.stop()
    apps.pop()
    await expect(page.locator('.ov-window')).toHaveAttribute('data-status', 'reconnecting')
    // Through the main app while the overlay's server is down.
    const after = await fence(table, s, second.id, ['a'])
    expect(after.a).toBeGreaterThan(score.a)
    app = await startSecondApp(QUICK_STOP, port)
    apps.push(app)
    await expect(page.locator('.ov-window')).toHaveAttribute('data-status', 'live', { timeout: 20_000 })
    await expect(page.locator('[data-score="a"]')).toHaveText(String(after.a), { timeout: 10_000 })
    await expect(page.locator('[data-score="b"]')).toHaveText(String(after.b))
    await organizer.dispose()
    await table.dispose()
  })

  test('two app processes share updates: the overlay on the second shows a bout posted through the first', async ({ page }) => {
    test.setTimeout(60_000)
    const organizer = await signedIn(demo.organizer)
    const table = await signedIn(demo.scorekeeper)
    const { s, second, score } = await ringUnderWay(organizer, table, 'two-apps')
    const app = await startSecondApp(QUICK_STOP)
    apps.push(app)
    await page.goto(`${app.url}${s.overlay}`)
    await expect(page.locator('.ov-window')).toHaveAttribute('data-status', 'live')
    await expect(page.locator('[data-score="b"]')).toHaveText(String(score.b))
    const after = await fence(table, s, second.id, ['b'])
    expect(after.b).toBeGreaterThan(score.b)
    await expect(page.locator('[data-score="b"]')).toHaveText(String(after.b), { timeout: 2000 })
    await organizer.dispose()
    await table.dispose()
  })
})

test('board changes wipe in, and not at all for viewers who ask for reduced motion', async ({ page }) => {
  const organizer = await signedIn(demo.organizer)
  const table = await signedIn(demo.scorekeeper)
  const { s } = await ringUnderWay(organizer, table, 'motion')
  await page.emulateMedia({ reducedMotion: 'no-preference' })
  await page.goto(s.overlay)
  await expect(page.locator('.ov-window')).toHaveAttribute('data-status', 'live')
  // Every CSS transition that starts, whatever the machine's speed: a busy one may finish a wipe between two looks.
  const started = () => page.evaluate(() => (window as unknown as { started: string[] }).started)
  await page.evaluate(() => {
    const w = window as unknown as { started: string[] }
    w.started = []
    document.addEventListener('transitionrun', event => w.started.push(event.propertyName), true)
  })
  const afterTwoFrames = () => page.evaluate(() => new Promise<void>(resolve => requestAnimationFrame(() => requestAnimationFrame(() => resolve()))))

  await ok(await organizer.post(`${s.rings}/1/board`, { data: { onAir: 'pool' } }))
  await expect(page.locator('[data-overlay-canvas]')).toHaveAttribute('data-board', 'pool')
  await expect.poll(started).toEqual(expect.arrayContaining(['opacity', 'clip-path']))
  await page.waitForFunction(() => document.getAnimations().length === 0)

  await page.emulateMedia({ reducedMotion: 'reduce' })
  await page.evaluate(() => {
    (window as unknown as { started: string[] }).started = []
  })
  await ok(await organizer.post(`${s.rings}/1/board`, { data: { onAir: 'up-next' } }))
  await expect(page.locator('[data-overlay-canvas]')).toHaveAttribute('data-board', 'up-next')
  await afterTwoFrames()
  expect(await started()).toEqual([])
  expect(await page.evaluate(() => document.getAnimations().length)).toBe(0)
  await organizer.dispose()
  await table.dispose()
})

test('the streamer puts a board on air from the cue desk on a tablet, the overlay follows, and the address is copied and replaced', async ({ page, browser, context }) => {
  test.setTimeout(90_000)
  const organizer = await signedIn(demo.organizer)
  const table = await signedIn(demo.scorekeeper)
  const { s, second, score } = await ringUnderWay(organizer, table, 'cue')
  const viewer = await browser.newPage({ viewport: { width: 1280, height: 720 } })
  await viewer.goto(s.overlay)
  const onScreen = viewer.locator('[data-overlay-canvas]')
  await expect(onScreen).toHaveAttribute('data-board', 'bout')

  await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: new URL(BASE).origin })
  await page.setViewportSize({ width: 820, height: 1180 })
  await signIn(page, demo.streamer)
  await page.goto(`/clubs/${DEMO_CLUB}/cue?event=${s.eventId}`)
  const ring = page.getByRole('region', { name: 'Ring 1' })
  await expect(page.getByRole('status').filter({ hasText: /^Live$/ })).toBeVisible()
  await expect(ring.locator('[data-on-air]')).toHaveText(/On air: Bout bar \(automatic\)/)
  await expect(ring.getByRole('switch', { name: 'Automatic mode, ring 1' })).toHaveAttribute('aria-checked', 'true')

  // Every board has a live preview, fed by the desk.
  const poolPreview = page.frameLocator('[data-preview="pool"] iframe')
  await expect(poolPreview.locator('[data-overlay-canvas]')).toHaveAttribute('data-board', 'pool')
  await expect(poolPreview.getByText(second.sideA!.name)).toBeVisible()
  await expect(page.frameLocator('[data-preview="bout"] iframe').locator('[data-score="a"]')).toHaveText(String(score.a))

  await ring.getByRole('button', { name: 'Put the pool board on air in ring 1' }).click()
  await expect(onScreen).toHaveAttribute('data-board', 'pool')
  await expect(ring.locator('[data-on-air]')).toHaveText(/On air: Pool board \(chosen by hand\)/)
  await expect(ring.getByRole('switch', { name: 'Automatic mode, ring 1' })).toHaveAttribute('aria-checked', 'false')

  // The preview follows a bout too, and automatic mode brings the bout bar back.
  const after = await fence(table, s, second.id, ['b'])
  await expect(page.frameLocator('[data-preview="bout"] iframe').locator('[data-score="b"]')).toHaveText(String(after.b))
  await ring.getByRole('switch', { name: 'Automatic mode, ring 1' }).click()
  await expect(onScreen).toHaveAttribute('data-board', 'bout')
  await expect(ring.locator('[data-on-air]')).toHaveText(/On air: Bout bar \(automatic\)/)

  // The address, absolute, with the size for the recording software; nothing wider than the tablet.
  const address = ring.getByRole('textbox', { name: 'Overlay address of ring 1' })
  await expect(address).toHaveValue(`${BASE}${s.overlay}`)
  await expect(ring.getByText(/1920 × 1080/)).toBeVisible()
  await expect(ring.getByText(/1280 × 720 or 3840 × 2160/)).toBeVisible()
  await ring.getByRole('button', { name: 'Copy the overlay address of ring 1' }).click()
  await expect(ring.getByText(/^Copied/)).toBeVisible()
  expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(`${BASE}${s.overlay}`)
  expect(await page.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth)).toBe(true)

  // Replacing it asks first, says the old one stops at once, and the open overlay shows the notice.
  await ring.getByRole('button', { name: 'New address' }).click()
  const dialog = page.getByRole('dialog', { name: 'Replace the overlay address of ring 1?' })
  await expect(dialog.getByText(/stops working at once/)).toBeVisible()
  await dialog.getByRole('button', { name: 'Replace the address' }).click()
  await expect(address).not.toHaveValue(`${BASE}${s.overlay}`)
  await expect(address).toHaveValue(new RegExp(`^${BASE}/overlay/[0-9a-f]{32,}$`))
  await expect(viewer.getByRole('alert')).toHaveText(/This overlay address was replaced/, { timeout: 10_000 })
  await viewer.close()
  await organizer.dispose()
  await table.dispose()
})

test('the public live page shows every ring\'s match and score, updates live, and reads without JavaScript', async ({ page, browser }) => {
  const organizer = await signedIn(demo.organizer)
  const table = await signedIn(demo.scorekeeper)
  const { s, first, second, firstScore, score } = await ringUnderWay(organizer, table, 'public')
  const published = await ok(await organizer.post(`/api/clubs/${s.clubId}/events/${s.eventId}/publish`)) as { slug: string }

  await page.goto(`/site/${DEMO_CLUB}/events/${published.slug}`)
  await page.getByRole('link', { name: 'Live scores from every ring' }).click()
  await expect(page).toHaveURL(new RegExp(`/events/${published.slug}/live$`))
  await expect(page.getByRole('status').filter({ hasText: /^Live: scores update/ })).toBeVisible()
  const ring = page.getByRole('article', { name: 'Ring 1' })
  await expect(ring.getByText(second.sideA!.name)).toBeVisible()
  await expect(ring.getByText(second.sideB!.name)).toBeVisible()
  await expect(ring.locator('[data-score="a"]')).toHaveText(String(score.a))
  await expect(ring.locator('[data-last-result]')).toHaveText(`${first.sideA!.name} beat ${first.sideB!.name} ${firstScore.a}–${firstScore.b}`)
  await expect(page.getByText('Emergency number', { exact: true })).toBeVisible()

  const after = await fence(table, s, second.id, ['b'])
  await expect(ring.locator('[data-score="b"]')).toHaveText(String(after.b), { timeout: 2000 })

  const reader = await browser.newContext({ javaScriptEnabled: false })
  const still = await reader.newPage()
  await still.goto(`/site/${DEMO_CLUB}/events/${published.slug}/live`)
  const plain = still.getByRole('article', { name: 'Ring 1' })
  await expect(plain.getByText(second.sideA!.name)).toBeVisible()
  await expect(plain.locator('[data-score="a"]')).toHaveText(String(after.a))
  await expect(plain.locator('[data-score="b"]')).toHaveText(String(after.b))
  await expect(still.getByText(/1600 N/)).toBeVisible()
  await reader.close()
  await organizer.dispose()
  await table.dispose()
})
