// Standings and qualification for a large invented event: 512 fighters in 64 pools of 8, every
// match fenced (3 bouts each), outcomes drawn from a fixed seed. Run: npx tsx bench/standings.ts
import { performance } from 'node:perf_hooks'
import { assessQualification, computeStandings, firstHitThreeBouts, mulberry32 } from '../shared/rules'
import type { Action, MatchEntry, Pool, PoolMatch, RuleSet, Side, Target } from '../shared/rules'

const POOLS = 64
const POOL_SIZE = 8
const WARM_UP = 5
const RUNS = 50
const CLUBS = ['saltmarsh', 'ironquay', 'north-downs', 'lanterngate', 'greyfield', 'old-mill']

const random = mulberry32(20260912)
const pick = <T>(weighted: readonly [T, number][]): T => {
  let x = random() * weighted.reduce((s, [, w]) => s + w, 0)
  for (const [value, w] of weighted) {
    x -= w
    if (x < 0) return value
  }
  return weighted[weighted.length - 1]![0]
}

const TARGET_ODDS: [Target, number][] = [['torso', 35], ['head', 20], ['arms', 20], ['legs', 15], ['hands', 10]]
const ACTION_ODDS: [Action, number][] = [['cut', 70], ['thrust', 30]]
const hit = () => ({ target: pick(TARGET_ODDS), action: pick(ACTION_ODDS) })
const side = (): Side => (random() < 0.5 ? 'a' : 'b')

/** A fenced match: three counted bouts, with the voids, cards and ring-outs a real ring sees. */
function fencedLog(matchId: string): MatchEntry[] {
  const entries: MatchEntry[] = []
  const id = () => `${matchId}-${entries.length + 1}`
  let counted = 0
  while (counted < 3) {
    const roll = random()
    if (roll < 0.04) entries.push({ kind: 'ring-out', id: id(), side: side() })
    else if (roll < 0.07) entries.push({ kind: 'card', id: id(), side: side(), colour: random() < 0.7 ? 'warning' : 'yellow' })
    else if (roll < 0.15) entries.push({ kind: 'void', id: id(), reason: random() < 0.6 ? 'not-seen' : 'no-valid-hit' })
    else {
      const kind = pick<'clean' | 'afterblow' | 'double'>([['clean', 62], ['afterblow', 22], ['double', 16]])
      const first = hit()
      if (kind === 'clean') entries.push({ kind, id: id(), side: side(), ...first })
      else if (kind === 'afterblow') entries.push({ kind, id: id(), side: side(), ...first, afterblow: hit() })
      else entries.push({ kind, id: id(), a: first, b: hit() })
      counted++
    }
    // One bout in fifty is entered wrongly and taken back by the desk.
    if (entries.length > 0 && random() < 0.02) entries.push({ kind: 'cancel', id: id(), targetId: entries[entries.length - 1]!.id })
  }
  return entries
}

function buildPools(unfoughtPerPool: number): Pool[] {
  return Array.from({ length: POOLS }, (_, p) => {
    const ids = Array.from({ length: POOL_SIZE }, (_, i) => `${CLUBS[(p * POOL_SIZE + i) % CLUBS.length]}-${p * POOL_SIZE + i + 1}`)
    const matches: PoolMatch[] = []
    for (let i = 0; i < POOL_SIZE; i++) {
      for (let j = i + 1; j < POOL_SIZE; j++) {
        const id = `pool-${p + 1}-m${matches.length + 1}`
        matches.push({ id, a: ids[i]!, b: ids[j]!, status: 'finished', entries: fencedLog(id) })
      }
    }
    for (const m of matches.slice(matches.length - unfoughtPerPool)) Object.assign(m, { status: 'unfought', entries: [] })
    return { fighters: ids.map(id => ({ id })), matches, lotSeed: `harvest-open/pool-${p + 1}` }
  })
}

function measure(label: string, work: () => void): number {
  for (let i = 0; i < WARM_UP; i++) work()
  const times: number[] = []
  for (let i = 0; i < RUNS; i++) {
    const start = performance.now()
    work()
    times.push(performance.now() - start)
  }
  times.sort((x, y) => x - y)
  const at = (q: number) => times[Math.min(times.length - 1, Math.ceil(q * times.length) - 1)]!
  const median = (times[(RUNS - 1) >> 1]! + times[RUNS >> 1]!) / 2
  console.log(`${label}: min ${times[0]!.toFixed(2)} ms, median ${median.toFixed(2)} ms, p95 ${at(0.95).toFixed(2)} ms (${RUNS} runs after ${WARM_UP} warm-up)`)
  return median
}

const ruleSet: RuleSet = { ...firstHitThreeBouts, qualification: { topN: 4, minSurvivalRate: 0.5 } }
const fenced = buildPools(0)
const midway = buildPools(4)
const entries = fenced.reduce((n, p) => n + p.matches.reduce((m, x) => m + x.entries.length, 0), 0)
console.log(`${POOLS} pools of ${POOL_SIZE} (${POOLS * POOL_SIZE} fighters, ${POOLS * 28} matches, ${entries} entries)`)

let sink = 0
const median = measure('standings + qualification, all fenced', () => {
  for (const pool of fenced) sink += assessQualification(ruleSet, pool).fighters.length
})
measure('standings only, all fenced', () => {
  for (const pool of fenced) sink += computeStandings(ruleSet, pool).rows.length
})
measure('standings + qualification, last 4 matches of each pool to fence', () => {
  for (const pool of midway) sink += assessQualification(ruleSet, pool).fighters.length
})
if (sink === 0) console.log('nothing computed')
console.log(`standings_ms_median=${median.toFixed(3)}`)
