// Result cards: the median time to draw one card of each size in this process (satori lays it
// out, resvg-wasm draws it, the PNG is encoded), then the same 1080×1080 card as an HTML page
// screenshotted by a warm headless Chromium, then 100 distinct cards drawn our way on two worker
// threads against the same 100 as screenshots on two Chromium pages. No app or database needed.
// Run: npm run bench:cards. The last line is the summary.
import { existsSync } from 'node:fs'
import os from 'node:os'
import { performance } from 'node:perf_hooks'
import { Worker } from 'node:worker_threads'
import { chromium } from 'playwright-core'
import { renderPng } from '../server/cards/render'
import { cardElement } from '../server/cards/templates'
import { CARD_KINDS, CARD_SIZE_NAMES, CARD_SIZES } from '../shared/cards/types'
import type { CardInput, CardSize } from '../shared/cards/types'
import { sampleInput } from '../tests/support/cards'
import { cardHtml, cardPageShell } from './cardHtml'

const PER_SIZE = 25
// Warm-up draws before the clock starts: V8 needs a few dozen cards before satori's code runs at
// the speed a long-running worker sees (5 left the first size measured ~1.6× slower than later).
const WARM_UP = 20
const CHROMIUM_RUNS = 25
const BATCH = 100
const PARALLEL = 2
// The flags of playwright.config.ts, for Debian's Chromium.
const CHROMIUM = {
  executablePath: '/usr/bin/chromium',
  args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b)
  const mid = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}
const round = (n: number) => Math.round(n * 10) / 10
const load = () => os.loadavg().map(n => n.toFixed(2)).join(' ')

/** Distinct cards of every kind in one size: the kinds in turn, names and figures varied by seed. */
const cardsOf = (size: CardSize, count: number, from = 0): CardInput[] =>
  Array.from({ length: count }, (_, i) => sampleInput(CARD_KINDS[(from + i) % CARD_KINDS.length]!, size, from + i))

async function drawHere(input: CardInput) {
  const { width, height } = CARD_SIZES[input.size]
  const started = performance.now()
  await renderPng(cardElement(input), width, height)
  return performance.now() - started
}

interface Thread { worker: Worker, send: (message: unknown) => Promise<void> }

/** A worker thread running bench/cardThread.ts through tsx, once it says it is ready. */
function startThread(): Promise<Thread> {
  const file = new URL('./cardThread.ts', import.meta.url).href
  const worker = new Worker(`import('tsx/esm/api').then(({ tsImport }) => tsImport(${JSON.stringify(file)}, ${JSON.stringify(import.meta.url)}))`, { eval: true })
  let waiting: { resolve: () => void, reject: (err: unknown) => void } | null = null
  const answer = () => new Promise<void>((resolve, reject) => {
    waiting = { resolve, reject }
  })
  worker.on('message', () => waiting?.resolve())
  worker.on('error', err => waiting?.reject(err))
  const ready = answer()
  const send = (message: unknown) => {
    const done = answer()
    worker.postMessage(message)
    return done
  }
  return ready.then(() => ({ worker, send }))
}

async function ourBatch(inputs: CardInput[]): Promise<number> {
  const threads = await Promise.all(Array.from({ length: PARALLEL }, startThread))
  try {
    // Each thread initialises the WebAssembly module and the fonts once, before the clock starts.
    await Promise.all(threads.map(t => t.send('warm')))
    let next = 0
    const started = performance.now()
    await Promise.all(threads.map(async (thread) => {
      while (next < inputs.length) {
        const id = next++
        await thread.send({ id, input: inputs[id] })
      }
    }))
    return performance.now() - started
  }
  finally {
    await Promise.all(threads.map(t => t.worker.terminate()))
  }
}

async function main() {
  if (!existsSync(CHROMIUM.executablePath)) {
    const { ensureDebianPackages } = await import('../scripts/lib/deps.mjs')
    await ensureDebianPackages(['e2e'], { status: '' })
  }
  console.log(`machine: ${os.cpus().length} cores, load average ${load()} (1, 5, 15 min) at the start`)

  // ——— our renderer, one card after another in this process ———
  for (const size of CARD_SIZE_NAMES) for (const input of cardsOf(size, WARM_UP, 1000)) await drawHere(input)
  const medians = new Map<CardSize, number>()
  for (const size of CARD_SIZE_NAMES) {
    const times = []
    for (const input of cardsOf(size, PER_SIZE)) times.push(await drawHere(input))
    medians.set(size, median(times))
    const { width, height } = CARD_SIZES[size]
    console.log(`ours: ${size} ${width}×${height} median_ms=${round(median(times))} (n=${PER_SIZE})`)
  }

  // ——— Chromium, warm: one browser and a page with the fonts loaded, a card per screenshot ———
  const browser = await chromium.launch({ headless: true, ...CHROMIUM })
  try {
    const shell = cardPageShell()
    const page = async () => {
      const p = await browser.newPage({ viewport: { width: 1080, height: 1080 }, deviceScaleFactor: 1 })
      await p.setContent(shell)
      await p.evaluate(() => document.fonts.ready.then(() => undefined))
      return p
    }
    const shoot = async (p: Awaited<ReturnType<typeof page>>, input: CardInput) => {
      await p.evaluate((html) => {
        document.body.innerHTML = html
        return document.fonts.ready.then(() => undefined)
      }, cardHtml(cardElement(input)))
      return p.screenshot({ type: 'png', clip: { x: 0, y: 0, width: 1080, height: 1080 } })
    }
    const first = await page()
    for (const input of cardsOf('square', WARM_UP, 1000)) await shoot(first, input)
    const times = []
    for (const input of cardsOf('square', CHROMIUM_RUNS)) {
      const started = performance.now()
      await shoot(first, input)
      times.push(performance.now() - started)
    }
    const chromiumMedian = median(times)
    console.log(`chromium: square 1080×1080 median_ms=${round(chromiumMedian)} (n=${CHROMIUM_RUNS}, warm page, fonts loaded)`)

    // ——— 100 distinct cards, two at a time on each side ———
    const batch = cardsOf('square', BATCH, 2000)
    const ours = await ourBatch(batch)
    const pages = [first, await page()]
    for (const p of pages.slice(1)) await shoot(p, batch[0]!)
    let next = 0
    const started = performance.now()
    await Promise.all(pages.map(async (p) => {
      while (next < batch.length) await shoot(p, batch[next++]!)
    }))
    const theirs = performance.now() - started
    console.log(`batch of ${BATCH}: ours ${Math.round(ours)} ms on ${PARALLEL} worker threads, chromium ${Math.round(theirs)} ms on ${PARALLEL} pages`)
    console.log(`machine: load average ${load()} at the end`)
    console.log(`card_ms_median=${round(medians.get('square')!)} chromium_ms_median=${round(chromiumMedian)} batch_speedup=${round(theirs / ours)}`)
  }
  finally {
    await browser.close()
  }
}

main().catch((err) => {
  console.error(err)
  process.exit(1)
})
