import { randomBytes } from 'node:crypto'
import { and, eq, inArray } from 'drizzle-orm'
import { zipSync } from 'fflate'
import type { Zippable } from 'fflate'
import { cardAltText, fileSlug } from '#shared/cards/text'
import type { JobRun } from '.'

// The studio's batch export: every card of a tournament in the chosen sizes, drawn (or found in
// the store) one by one with the progress written as it goes, then one ZIP in object storage
// with an alt-text.csv beside the pictures. Safe to run again: a retry starts the count afresh
// and finds the cards already drawn in the store.

const PROGRESS_EVERY_MS = 250

export async function renderCardBatch(data: { batchId: number }, job: JobRun) {
  const db = useDb()
  const b = schema.cardBatches
  const [batch] = await db.update(b)
    .set({ status: 'running', startedAt: new Date(), worker: WORKER_NAME, done: 0, reused: 0, error: null })
    .where(and(eq(b.id, data.batchId), inArray(b.status, ['queued', 'running']))).returning()
  // Gone with its tournament, or finished by an earlier run.
  if (!batch) return
  try {
    const source = await db.transaction(async tx => loadCardSource(tx, await findCardTournament(tx, batch.clubId, batch.tournamentId)))
    const brand = await cardBrand(source.club)
    const items = batchItems(source, batch.sizes)
    await db.update(b).set({ total: items.length }).where(eq(b.id, batch.id))

    const folder = fileSlug(source.tournament.name)
    const files: Zippable = {}
    const lines = [['file', 'headline', 'caption', 'alt text'].map(csvField).join(',')]
    let done = 0
    let reused = 0
    let written = Date.now()
    for (const item of items) {
      const input = cardInput(cardData(source, item.kind, item.subjectId), item.size, brand)
      const card = await produceCard(batch.clubId, input, { keepPng: true })
      const path = `${folder}/${item.path}`
      // PNGs are compressed already: stored as they are.
      files[path] = [card.png!, { level: 0 }]
      lines.push([path, input.headline, input.caption, cardAltText(input)].map(csvField).join(','))
      done += 1
      if (card.cached) reused += 1
      if (Date.now() - written >= PROGRESS_EVERY_MS) {
        await db.update(b).set({ done, reused }).where(eq(b.id, batch.id))
        written = Date.now()
      }
    }
    files[`${folder}/alt-text.csv`] = [Buffer.from(`${lines.join('\r\n')}\r\n`), { level: 6 }]
    const zip = zipSync(files, { mtime: batch.createdAt })
    const key = `card-batches/${batch.clubId}/${batch.id}-${randomBytes(8).toString('hex')}.zip`
    await putObject(key, zip, 'application/zip')
    await db.update(b).set({ status: 'done', done, reused, zipKey: key, zipBytes: zip.length, finishedAt: new Date() }).where(eq(b.id, batch.id))
  }
  catch (err) {
    const message = err instanceof Error ? err.message : String(err)
    await db.update(b).set(job.lastAttempt
      ? { status: 'failed', error: `The export failed: ${message}`, finishedAt: new Date() }
      : { status: 'queued', error: `Trying again after: ${message}` }).where(eq(b.id, batch.id)).catch(() => {})
    throw err
  }
}
