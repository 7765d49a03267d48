import { readFile } from 'node:fs/promises'
import { expect, test } from '@playwright/test'
import { PNG } from 'pngjs'
import { readZip } from '../support/zip'
import type { Page } from '@playwright/test'
import { DEMO_CLUB, demo } from './support'

// The card studio with the demo event, as the club's social editor uses it.

/** Signs in through the API (the browser keeps the cookie): the studio is what these tests are about. */
async function signInAsEditor(page: Page) {
  const res = await page.request.post('/api/auth/sign-in', { data: demo.editor })
  expect(res.status()).toBe(200)
}

// Decoded with pngjs, written apart from the app's encoder (PNG: ISO/IEC 15948).
const decode = async (path: string) => PNG.sync.read(await readFile(path))

/** Other tests add events to the demo club: the studio is pointed at the demo event's finished tournament. */
async function chooseDemoTournament(page: Page) {
  const tournament = page.getByLabel('Tournament', { exact: true })
  await expect(tournament).toHaveValue(/\d+/)
  const demoGroup = tournament.locator('optgroup[label="Wrenmouth Harvest Open"]')
  await tournament.selectOption(await demoGroup.locator('option', { hasText: 'Sword and buckler' }).getAttribute('value'))
}

test('the editor previews a card, changes its headline and size, and downloads the PNG', async ({ page }) => {
  await signInAsEditor(page)
  await page.goto(`/clubs/${DEMO_CLUB}/cards`)
  await expect(page.getByRole('heading', { name: 'Cards', level: 1 })).toBeVisible()
  await chooseDemoTournament(page)

  const preview = page.getByTestId('card-preview')
  await expect(preview).toHaveAttribute('src', /\/media\/cards\/\d+\/[0-9a-f]{64}\.png/)
  await expect.poll(() => preview.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(1080)
  await expect(preview).toHaveAttribute('alt', /Result card of Saltmarsh Sword Guild/)

  await page.getByRole('radio', { name: 'A pool' }).check()
  await expect(page.getByLabel('Pool', { exact: true })).toBeVisible()
  await expect(preview).toHaveAttribute('alt', /Pool 1/)

  const before = await preview.getAttribute('src')
  await page.getByLabel('Headline').fill('Pool one, settled')
  await expect(preview).not.toHaveAttribute('src', before!)
  await expect(page.getByLabel('Alt text')).toHaveValue(/“Pool one, settled”/)

  await page.getByRole('radio', { name: /Story/ }).check()
  await expect.poll(() => preview.evaluate((img: HTMLImageElement) => [img.naturalWidth, img.naturalHeight])).toEqual([1080, 1920])
  // The headline the editor wrote stays with the new size.
  await expect(page.getByLabel('Headline')).toHaveValue('Pool one, settled')

  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('card-download').click()])
  expect(download.suggestedFilename()).toMatch(/^sword-and-buckler-pool-pool-1-story\.png$/)
  const png = await decode(await download.path())
  expect([png.width, png.height]).toEqual([1080, 1920])
})

test('the editor exports every card of a tournament as a ZIP and watches the progress', async ({ page }) => {
  test.setTimeout(120_000)
  await signInAsEditor(page)
  await page.goto(`/clubs/${DEMO_CLUB}/cards`)
  await chooseDemoTournament(page)
  const exportPanel = page.locator('section[aria-labelledby="batch-title"]')
  await expect(exportPanel).toBeVisible()
  for (const size of ['Square', 'Portrait', 'Story']) await exportPanel.getByRole('checkbox', { name: new RegExp(size) }).uncheck()
  const button = exportPanel.getByRole('button', { name: /Export \d+ cards as ZIP/ })
  const count = Number((await button.textContent())!.match(/Export (\d+) cards/)![1])
  expect(count).toBeGreaterThan(60)
  await button.click()

  const bar = exportPanel.getByRole('progressbar', { name: 'Export progress' })
  await expect(bar).toBeVisible()
  // The bar moves on while the worker draws the cards, and ends full.
  await expect(exportPanel.getByTestId('batch-status')).toContainText(/of \d+ cards|Waiting|Reading|ready/)
  await expect(exportPanel.getByTestId('batch-download')).toBeVisible({ timeout: 100_000 })
  await expect(bar).toHaveAttribute('aria-valuenow', '100')
  await expect(exportPanel.getByTestId('batch-status')).toContainText(`${count} cards ready`)

  const [download] = await Promise.all([page.waitForEvent('download'), exportPanel.getByTestId('batch-download').click()])
  expect(download.suggestedFilename()).toBe('sword-and-buckler-cards.zip')
  const files = readZip(await readFile((await download.path())!))
  const pngs = [...files.keys()].filter(name => name.endsWith('.png'))
  expect(pngs).toHaveLength(count)
  expect(pngs.every(name => name.startsWith('sword-and-buckler/link/'))).toBe(true)
  expect(files.has('sword-and-buckler/alt-text.csv')).toBe(true)
  const png = PNG.sync.read(files.get(pngs[0]!)!)
  expect([png.width, png.height]).toEqual([1200, 630])
})

test('the public match page of the demo event works without scripts and links to its fighters', async ({ browser }) => {
  const context = await browser.newContext({ javaScriptEnabled: false })
  const page = await context.newPage()
  await page.goto(`/site/${DEMO_CLUB}/events/wrenmouth-harvest-open`)
  // The pools' bout lists open without scripts: they are <details>.
  await page.getByText(/Bout order and results/).first().click()
  await page.getByRole('link', { name: /^Match 1,/ }).first().click()
  await expect(page).toHaveURL(/\/matches\/\d+$/)
  await expect(page.getByRole('heading', { level: 1 })).toContainText(' v ')
  await expect(page.getByRole('table')).toContainText(/Bout/)
  await expect(page.getByText('Safety on the day')).toBeVisible()
  await page.locator('a[href*="/fighters/"]').first().click()
  await expect(page).toHaveURL(/\/fighters\/\d+$/)
  await expect(page.getByText('Survival rate').first()).toBeVisible()
  await context.close()
})
