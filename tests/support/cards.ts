// Card inputs for the unit tests and the benchmark: one of every kind, with invented fighters of
// the demo's invented clubs, and a way to make many distinct ones.
import type { CardBout, CardData, CardInput, CardKind, CardSize, PoolCardRow } from '../../shared/cards/types'
import { defaultCaption, defaultHeadline } from '../../shared/cards/text'

const context = { clubName: 'Saltmarsh Sword Guild', eventName: 'Wrenmouth Harvest Open', tournamentName: 'Sword and buckler', dates: '10 October 2026' }

export const SAMPLE_BRAND = { clubName: 'Saltmarsh Sword Guild', primary: '#1f3a4d', secondary: '#d9ad4f', logo: null }

const NAMES: [string, string][] = [
  ['Maren Holt', 'Saltmarsh Sword Guild'], ['Elias Corran', 'Ironquay Fencing Hall'], ['Tilda Greaves', 'Lanterngate Historical Fencing'],
  ['Oswin Hale', 'North Downs Buckler Circle'], ['Juno Harrow', 'Old Mill Fencing School'], ['Fenwick Rhys', 'Greyfield Sword Society'],
  ['Hester Quill', 'Ironquay Fencing Hall'], ['Idris Penhallow', 'Lanterngate Historical Fencing'],
]

const fighter = (i: number) => ({ name: NAMES[i % NAMES.length]![0], clubName: NAMES[i % NAMES.length]![1] })

function bouts(n: number, seed: number): CardBout[] {
  return Array.from({ length: n }, (_, i) => {
    const k = (seed + i * 7) % 5
    if (k === 0) return { number: i + 1, kind: 'double' as const, points: { a: 0, b: 0 }, hit: { a: true, b: true } }
    if (k === 1) return { number: i + 1, kind: 'afterblow' as const, points: { a: 2, b: 1 }, hit: { a: true, b: true } }
    const a = k % 2 === 0
    return { number: i + 1, kind: 'clean' as const, points: { a: a ? 2 : 0, b: a ? 0 : 3 }, hit: { a: !a, b: a } }
  })
}

function poolRows(n: number, seed: number): PoolCardRow[] {
  return Array.from({ length: n }, (_, i) => {
    const wins = Math.max(0, n - 1 - i - (seed % 2))
    const bouts = (n - 1) * 3
    const unharmed = Math.max(0, bouts - 3 - i * 2 - (seed % 3))
    return { rank: i + 1, ...fighter(i + seed), wins, losses: n - 1 - wins, draws: 0, bouts, unharmed, survivalRate: unharmed / bouts, indicator: 8 - i * 3 + (seed % 4), out: false }
  })
}

/** The data of one card of a kind; `seed` varies names and figures so that cards differ. */
export function sampleData(kind: CardKind, seed = 0): CardData {
  switch (kind) {
    case 'match': {
      const strip = bouts(3 + (seed % 2), seed)
      const score = strip.reduce((s, b) => ({ a: s.a + b.points.a, b: s.b + b.points.b }), { a: 0, b: 0 })
      return {
        kind, context, stage: `Pool ${1 + (seed % 3)}, match ${1 + (seed % 15)}`, format: 'first-hit', a: fighter(seed), b: fighter(seed + 3),
        score, status: 'finished', result: score.a > score.b ? 'a' : score.b > score.a ? 'b' : 'draw', forfeitedBy: null, bouts: strip,
      }
    }
    case 'fighter':
      return {
        kind, context, fighter: fighter(seed), pool: { number: 1 + (seed % 3), rank: 1 + (seed % 6), size: 6, complete: true },
        overall: { rank: 1 + (seed % 18), of: 18, complete: true }, record: { wins: 4 - (seed % 3), losses: 1 + (seed % 3), draws: 0 },
        bouts: 15, unharmed: 9 - (seed % 4), survivalRate: (9 - (seed % 4)) / 15, qualification: seed % 3 === 0 ? 'qualified' : 'out', topN: 4,
      }
    case 'pool':
      return { kind, context, number: 1 + (seed % 3), complete: true, rows: poolRows(6, seed) }
    case 'podium':
      return { kind, context, complete: true, places: [1, 2, 3, 4].map(place => ({ place, fighter: fighter(place + seed), seed: null })) }
    case 'summary':
      return { kind, context, fighters: 18 + (seed % 5), clubs: 6, matches: 45 + seed, bouts: 141 + seed * 3, doubles: 14 + (seed % 7), doublesRate: (14 + (seed % 7)) / (141 + seed * 3), winner: seed % 2 ? fighter(seed) : null }
  }
}

export function sampleInput(kind: CardKind, size: CardSize, seed = 0, brand = SAMPLE_BRAND): CardInput {
  const data = sampleData(kind, seed)
  return { data, size, headline: defaultHeadline(data), caption: defaultCaption(data), brand }
}
