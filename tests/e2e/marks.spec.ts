import { expect, test } from '@playwright/test'
import type { Page } from '@playwright/test'
import { and, eq } from 'drizzle-orm'
import { makeClip } from '../support/clips'
import type { TestClip } from '../support/clips'
import { db, makeClub, PASSWORD, schema } from '../support/fixtures'
import { DEMO_CLUB, demo, signIn } from './support'

// Clips are made in the demo club, on its published demo event, the way the footage pipeline
// leaves them (tests/support/clips.ts); each test makes its own.
let clubId: number
let eventId: number

test.beforeAll(async () => {
  const [club] = await db.select().from(schema.clubs).where(eq(schema.clubs.slug, DEMO_CLUB))
  clubId = club!.id
  const [event] = await db.select().from(schema.events).where(and(eq(schema.events.clubId, clubId), eq(schema.events.slug, 'wrenmouth-harvest-open')))
  eventId = event!.id
})

const marksOf = (clip: TestClip) => db.select().from(schema.marks).where(eq(schema.marks.clipId, clip.id)).orderBy(schema.marks.atMs)

async function videoReady(page: Page, testId: string) {
  await expect.poll(() => page.getByTestId(testId).evaluate((v: HTMLVideoElement) => v.readyState), { timeout: 15_000 }).toBeGreaterThanOrEqual(1)
}

test('a commentator marks the current time with a key, steps frames, moves, edits, deletes and undoes a mark', async ({ page }) => {
  const clip = await makeClip(clubId, { eventId, title: 'Longsword pool 2, match 4' })
  await signIn(page, demo.commentator)
  await page.goto(`/clubs/${DEMO_CLUB}/footage/clips/${clip.id}`)
  await expect(page.getByRole('heading', { name: 'Longsword pool 2, match 4' })).toBeVisible()
  await expect(page.getByText('No marks yet.')).toBeVisible()
  await videoReady(page, 'clip-video')
  // The keys are listed on screen.
  const keys = page.getByRole('region', { name: 'Keys' }).or(page.locator('section', { has: page.getByRole('heading', { name: 'Keys' }) }))
  await expect(keys).toContainText('One frame forward')
  await expect(keys).toContainText('Mark at the current time')

  // Three frames forward at the recording's 25 fps: 120 ms; one second forward, one frame back.
  for (let i = 0; i < 3; i++) await page.keyboard.press('.')
  await expect(page.getByTestId('clip-time')).toContainText('0:00.12')
  await page.keyboard.press('ArrowRight')
  await page.keyboard.press(',')
  await expect(page.getByTestId('clip-time')).toContainText('0:01.08')
  await expect.poll(() => page.getByTestId('clip-video').evaluate((v: HTMLVideoElement) => Math.round(v.currentTime * 1000))).toBe(1080)

  await page.keyboard.press('m')
  const list = page.getByTestId('marks-list')
  await expect(list.getByRole('button')).toHaveCount(1)
  await expect(list).toContainText('0:01.08')
  await expect.poll(async () => (await marksOf(clip)).map(m => [m.atMs, m.label])).toEqual([[1080, 'Hit']])

  // One frame later with the key, then dragged to about the middle of the timeline.
  await page.keyboard.press(']')
  await expect(list).toContainText('0:01.12')
  await expect.poll(async () => (await marksOf(clip))[0]?.atMs).toBe(1120)
  const timeline = page.getByTestId('clip-timeline')
  await timeline.scrollIntoViewIfNeeded()
  const box = (await timeline.boundingBox())!
  const handle = timeline.getByRole('button', { name: /^Hit at/ })
  const from = (await handle.boundingBox())!
  await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2)
  await page.mouse.down()
  await page.mouse.move(box.x + box.width * 0.3, from.y + from.height / 2, { steps: 5 })
  await page.mouse.move(box.x + box.width * 0.5, from.y + from.height / 2, { steps: 5 })
  await page.mouse.up()
  await expect.poll(async () => (await marksOf(clip))[0]?.atMs).toBeGreaterThan(2700)
  expect((await marksOf(clip))[0]!.atMs).toBeLessThan(3300)

  // Edit the comment in the form.
  await page.getByLabel('Comment').fill('Cut to the wrist as the bind broke')
  await page.getByLabel('Comment').press('Enter')
  await expect(list).toContainText('Cut to the wrist as the bind broke')
  await expect.poll(async () => (await marksOf(clip))[0]?.comment).toBe('Cut to the wrist as the bind broke')

  // Delete with the key (not while typing), then undo.
  await page.getByLabel('Comment').blur()
  await page.keyboard.press('Delete')
  await expect(page.getByText('No marks yet.')).toBeVisible()
  await expect.poll(async () => (await marksOf(clip)).length).toBe(0)
  await page.getByRole('button', { name: /Undo/ }).click()
  await expect(list.getByRole('button')).toHaveCount(1)
  await expect(list).toContainText('Cut to the wrist as the bind broke')
  const back = await marksOf(clip)
  expect(back).toHaveLength(1)
  expect(back[0]!.comment).toBe('Cut to the wrist as the bind broke')
})

test('a commentator edits the club’s kinds of action, and a kind in use cannot be deleted', async ({ page }) => {
  // A club of its own, so the demo club's list stays as it is.
  const club = await makeClub('kinds-e2e')
  const clip = await makeClip(club.id)
  await signIn(page, { email: club.members.commentator.email, password: PASSWORD })
  await page.goto(`/clubs/${club.slug}/footage/clips/${clip.id}`)
  const panel = page.locator('section', { has: page.getByRole('heading', { name: 'Kinds of action' }) })
  const names = () => panel.getByRole('listitem').getByRole('textbox')
  await expect(names()).toHaveCount(6)
  await expect(names().first()).toHaveValue('hit')

  await panel.getByLabel('New kind').fill('Disarm')
  await panel.getByRole('button', { name: 'Add kind' }).click()
  await expect(names()).toHaveCount(7)
  await expect(names().last()).toHaveValue('Disarm')
  await panel.getByRole('button', { name: 'Move Disarm up' }).click()
  await expect(names().nth(5)).toHaveValue('Disarm')

  await names().nth(4).fill('Feint in tempo')
  await names().nth(4).press('Enter')
  await expect.poll(async () => (await db.select().from(schema.markKinds).where(eq(schema.markKinds.clubId, club.id)))
    .sort((a, b) => a.position - b.position).map(k => k.name))
    .toEqual(['hit', 'afterblow', 'double', 'parry', 'Feint in tempo', 'Disarm', 'footwork'])

  // A mark of the first kind, then that kind cannot go.
  await names().nth(4).blur()
  await page.keyboard.press('m')
  await expect(page.getByTestId('marks-list').getByRole('button')).toHaveCount(1)
  await panel.getByRole('button', { name: 'Delete hit' }).click()
  await expect(panel.getByRole('alert')).toContainText('1 mark uses this kind, so it cannot be deleted')
  await expect(names()).toHaveCount(7)
  await panel.getByRole('button', { name: 'Delete footwork' }).click()
  await expect(names()).toHaveCount(6)
})

test('a reader of the embedded player jumps to a mark from the list and reads its words over the playing video', async ({ page }) => {
  const clip = await makeClip(clubId, { eventId, title: 'Sword and buckler final' })
  await db.insert(schema.marks).values([
    { clipId: clip.id, atMs: 500, label: 'Hit', comment: 'to the forearm' },
    { clipId: clip.id, atMs: 3000, label: 'Afterblow', comment: 'late, but counted' },
  ])
  // Framed by a page of our own site, as a breakdown post would; the window is iframe-sized.
  await page.setViewportSize({ width: 900, height: 700 })
  await page.goto(`/site/${DEMO_CLUB}`)
  await page.evaluate((src) => {
    const frame = document.createElement('iframe')
    frame.src = src
    frame.title = 'Clip'
    frame.width = '640'
    frame.height = '420'
    frame.id = 'clip-frame'
    document.body.prepend(frame)
  }, `/embed/clips/${clip.id}`)
  const frame = page.frameLocator('#clip-frame')
  const marks = frame.getByRole('navigation', { name: 'Marked actions' }).getByRole('button')
  await expect(marks).toHaveCount(2)
  await expect(marks.nth(0)).toContainText('Hit')
  await expect(marks.nth(1)).toContainText('Afterblow')
  const video = frame.getByTestId('player-video')
  await expect.poll(() => video.evaluate((v: HTMLVideoElement) => v.readyState), { timeout: 15_000 }).toBeGreaterThanOrEqual(1)
  // No scrollbars inside the frame.
  const sizes = await frame.locator('html').evaluate(html => ({ scroll: html.scrollHeight, client: html.clientHeight, scrollW: html.scrollWidth, clientW: html.clientWidth }))
  expect(sizes.scroll).toBeLessThanOrEqual(sizes.client)
  expect(sizes.scrollW).toBeLessThanOrEqual(sizes.clientW)

  await marks.nth(1).click()
  await expect.poll(() => video.evaluate((v: HTMLVideoElement) => v.currentTime)).toBeCloseTo(3, 1)
  await expect(marks.nth(1)).toHaveAttribute('aria-current', 'true')

  // Keyboard: a mark is reachable by focus and jumps the video with Enter.
  await marks.nth(0).focus()
  await page.keyboard.press('Enter')
  await expect.poll(() => video.evaluate((v: HTMLVideoElement) => v.currentTime)).toBeCloseTo(0.5, 1)

  // Played from there, each mark's words come up over the picture as the video reaches it.
  const embed = page.frame({ url: /\/embed\/clips\// })!
  await video.evaluate((v: HTMLVideoElement) => {
    v.muted = true
    return v.play()
  })
  const showsWhilePlaying = (words: string[]) => embed.waitForFunction((expected) => {
    const overlay = document.querySelector('[data-testid="player-overlay"]')?.textContent ?? ''
    const playing = !(document.querySelector('video') as HTMLVideoElement).paused
    return playing && expected.every(word => overlay.includes(word))
  }, words, { polling: 'raf', timeout: 10_000 })
  await showsWhilePlaying(['Hit', 'to the forearm'])
  await showsWhilePlaying(['Afterblow', 'late, but counted'])

  // The marks track is attached for players that read tracks.
  await expect(frame.locator('track[kind="metadata"]')).toHaveAttribute('src', `/media/public/clips/${clip.id}/marks.vtt`)
})

test('the embedded player of a clip whose event is not published is not found', async ({ page }) => {
  const clip = await makeClip(clubId, { published: false })
  const res = await page.goto(`/embed/clips/${clip.id}`)
  expect(res?.status()).toBe(404)
})
