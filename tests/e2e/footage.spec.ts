import { expect, test } from '@playwright/test'
import type { Request } from '@playwright/test'
import { pool } from '../support/fixtures'
import { makeFootage } from '../support/footage'
import { DEMO_CLUB, demo } from './support'

// A commentator brings a ring's recording in, lines it up with the desk and cuts a match, in
// Chromium against the app, the worker with Debian's ffmpeg and the fake S3.

const DEMO_EVENT = 'Wrenmouth Harvest Open'

test('a commentator uploads through an interruption and a reload, syncs the marks and cuts a match with its poster', async ({ page }) => {
  test.setTimeout(180_000)
  // The demo desk's first entry in ring 1 of the demo event; the camera started 3 s before it.
  const { rows } = await pool.query<{ at: Date }>(`
    select e.recorded_at as at from match_entries e
    join matches m on m.id = e.match_id join pools p on p.id = m.pool_id
    join tournaments t on t.id = m.tournament_id join events ev on ev.id = t.event_id
    join clubs c on c.id = ev.club_id
    where c.slug = $1 and ev.name = $2 and p.ring_number = 1 order by e.recorded_at limit 1`, [DEMO_CLUB, DEMO_EVENT])
  expect(rows).toHaveLength(1)
  const file = await makeFootage({ creationTime: new Date(rows[0]!.at.getTime() - 3000) })

  const res = await page.request.post('/api/auth/sign-in', { data: demo.commentator })
  expect(res.status()).toBe(200)

  // Every part the browser sends to the store, and one connection dropped on part 2.
  const puts: string[] = []
  let firstPartDone!: () => void
  const firstPart = new Promise<void>(resolve => (firstPartDone = resolve))
  const partOf = (request: Request) => (request.method() === 'PUT' ? new URL(request.url()).searchParams.get('partNumber') : null)
  page.on('request', (request) => {
    const n = partOf(request)
    if (n) puts.push(n)
  })
  page.on('requestfinished', (request) => {
    if (partOf(request) === '1') firstPartDone()
  })
  let dropped = false
  await page.route(url => url.searchParams.get('partNumber') === '2', async (route) => {
    if (route.request().method() !== 'PUT' || dropped) return route.fallback()
    dropped = true
    await firstPart
    await route.abort('connectionreset')
  })

  await page.goto(`/clubs/${DEMO_CLUB}/footage`)
  await expect(page.getByRole('heading', { name: 'Footage', level: 1 })).toBeVisible()
  await page.waitForFunction(() => Boolean((document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__))
  // Other tests add later events to the demo club, and the newest is chosen first.
  const eventSelect = page.getByLabel('Event', { exact: true })
  await eventSelect.selectOption(await eventSelect.locator('option', { hasText: DEMO_EVENT }).getAttribute('value'))
  await page.getByLabel('Ring', { exact: true }).selectOption('1')
  await page.getByLabel('Video file').setInputFiles(file)
  await page.getByLabel('Title').fill('Ring 1, first hour')
  await page.getByRole('button', { name: 'Upload', exact: true }).click()

  const bar = page.getByRole('progressbar', { name: 'Upload progress' })
  await expect(bar).toBeVisible()
  await expect(page.getByRole('alert')).toContainText('interrupted')
  expect(puts.filter(n => n === '1')).toHaveLength(1)

  // The tablet reloads the page: the file is chosen again and the upload carries on.
  await page.reload()
  await page.waitForFunction(() => Boolean((document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__))
  await expect(page.getByTestId(/^recording-/).filter({ hasText: 'Upload not finished' }).last()).toContainText('Ring 1, first hour')
  await page.getByLabel('Video file').setInputFiles(file)
  await page.getByRole('button', { name: 'Upload', exact: true }).click()
  await expect(bar).toHaveAttribute('aria-valuenow', '100')
  await expect(page.getByText(/being read/)).toBeVisible()
  // Part 1 had arrived: the store listed it, and it was not sent again.
  expect(puts.filter(n => n === '1')).toHaveLength(1)
  expect(puts.filter(n => n === '2').length).toBeGreaterThanOrEqual(2)

  const link = page.getByRole('link', { name: 'Ring 1, first hour' }).last()
  await expect(link).toBeVisible({ timeout: 60_000 })
  await link.click()

  await expect(page.getByTestId('recording-video')).toBeVisible()
  await expect.poll(() => page.getByTestId('recording-video').evaluate((v: HTMLVideoElement) => v.readyState)).toBeGreaterThanOrEqual(1)
  await expect(page.getByTestId('offset')).toHaveText('+0.000 s')
  const firstMark = page.getByTestId('timeline').getByRole('button').first()
  const label = await firstMark.getAttribute('aria-label')
  const markAt = (text: string | null) => /at (\d+):(\d+)\.(\d+)$/.exec(text ?? '')!.slice(1).map(Number)
  const [m0, s0, ms0] = markAt(label)
  const before = (m0! * 60 + s0!) * 1000 + ms0!
  const secondLabelBefore = await page.getByTestId('timeline').getByRole('button').nth(1).getAttribute('aria-label')

  // Marks of one burst of desk entries sit close together: chosen by keyboard, as a tablet user with a keyboard would.
  await firstMark.focus()
  await page.keyboard.press('Enter')
  await expect(page.getByRole('button', { name: /Put the mark here/ })).toBeVisible()
  // Five frames later (25 fps): 200 ms.
  for (let i = 0; i < 5; i++) await page.keyboard.press('.')
  await page.keyboard.press('m')
  await expect(page.getByTestId('offset')).not.toHaveText('+0.000 s')
  const offsetMs = Math.round(Number((await page.getByTestId('offset').textContent())!.replace(/[+ s]/g, '')) * 1000)
  // The mark landed on the start of the frame shown, within a frame of 200 ms later.
  expect(Math.abs(offsetMs - 200)).toBeLessThanOrEqual(40)
  const [m2, s2, ms2] = markAt(await page.getByTestId('timeline').getByRole('button').nth(1).getAttribute('aria-label'))
  const [m1, s1, ms1] = markAt(secondLabelBefore)
  // Every other mark moved by the same offset.
  expect((m2! * 60 + s2!) * 1000 + ms2! - ((m1! * 60 + s1!) * 1000 + ms1!)).toBe(offsetMs)
  expect(before).toBeGreaterThanOrEqual(0)

  await page.getByLabel('How to cut').selectOption('copy')
  await page.getByRole('button', { name: 'Cut the match' }).first().click()
  await expect(page.getByRole('progressbar', { name: /^Progress of / })).toBeVisible()
  const poster = page.getByTestId('clip-poster')
  await expect(poster).toBeVisible({ timeout: 60_000 })
  const posterUrl = await poster.getAttribute('href')
  const image = await page.request.get(posterUrl!)
  expect(image.headers()['content-type']).toBe('image/jpeg')
  // JPEG files start with the SOI marker FF D8 (ITU-T T.81, B.1.1.3).
  expect([...(await image.body()).subarray(0, 2)]).toEqual([0xFF, 0xD8])
})
