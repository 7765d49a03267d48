import { CARD_SIZES } from '#shared/cards/types'
import type { CardKind, CardSize } from '#shared/cards/types'
import { fileSlug } from '#shared/cards/text'
import type { CardSource } from './cardData'

type CardBatch = typeof schema.cardBatches.$inferSelect

export function cardBatchView(batch: CardBatch, tournamentName: string) {
  const name = `${fileSlug(tournamentName)}-cards`
  return {
    id: batch.id,
    tournamentId: batch.tournamentId,
    sizes: batch.sizes,
    status: batch.status,
    total: batch.total,
    done: batch.done,
    reused: batch.reused,
    error: batch.error,
    zipBytes: batch.zipBytes,
    downloadUrl: batch.status === 'done' ? `/media/cards/${batch.clubId}/batch-${batch.id}.zip?download=${name}` : null,
    createdAt: batch.createdAt,
    finishedAt: batch.finishedAt,
  }
}

export interface BatchItem {
  kind: CardKind
  subjectId: number
  size: CardSize
  /** Path inside the ZIP: <size>/<kind>-<subject>.png */
  path: string
}

/** Every card of a tournament in the given sizes, with a file name each, in the studio's order. */
export function batchItems(source: CardSource, sizes: readonly CardSize[]): BatchItem[] {
  const options = cardSubjects(source)
  const names = new Map<string, number>()
  const named = options.flatMap(option => option.kinds.map((kind) => {
    const base = `${kind}-${fileSlug(option.slug)}`
    names.set(base, (names.get(base) ?? 0) + 1)
    return { kind, option, base }
  }))
  // Two fighters of the same name (from different clubs) keep apart by their id.
  const unique = named.map(n => ({ ...n, name: names.get(n.base)! > 1 ? `${n.base}-${n.option.id}` : n.base }))
  const ordered = [...sizes].sort((a, b) => Object.keys(CARD_SIZES).indexOf(a) - Object.keys(CARD_SIZES).indexOf(b))
  return ordered.flatMap(size => unique.map(n => ({ kind: n.kind, subjectId: n.option.id, size, path: `${size}/${n.name}.png` })))
}

/** A CSV field (RFC 4180): quoted, with quotes doubled. */
export const csvField = (value: string) => `"${value.replace(/"/g, '""')}"`
