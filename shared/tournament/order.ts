import type { Pair, Pairing } from './types'

const pairs = (text: string): Pair[] =>
  text.split(' ').map((pair) => {
    const [a, b] = pair.split('-').map(Number)
    return [a!, b!] as const
  })

/**
 * Bout order within a pool, by position. 4, 5 and 6 are the FIE's order tables as remembered in
 * DOMAIN.md (MEMORY, not checked against the source; the tests check their properties only).
 * 7 and 8 are our own, found by search: every pair once, nobody twice in a row, at least two
 * matches of rest for everyone (the most possible for 7 and for 8), and sides balanced.
 */
export const POOL_ORDER_TABLES: Readonly<Record<4 | 5 | 6 | 7 | 8, readonly Pair[]>> = {
  4: pairs('1-4 2-3 1-3 2-4 3-4 1-2'),
  5: pairs('1-2 3-4 5-1 2-3 5-4 1-3 2-5 4-1 3-5 4-2'),
  6: pairs('1-2 4-5 2-3 5-6 3-1 6-4 2-5 1-4 5-3 1-6 4-2 3-6 5-1 3-4 6-2'),
  7: pairs('1-2 3-4 5-6 7-1 2-3 4-5 6-7 3-1 5-2 6-4 7-3 1-5 2-6 4-7 5-3 6-1 4-2 7-5 3-6 1-4 2-7'),
  8: pairs('1-2 3-4 5-6 7-8 1-4 2-3 8-5 6-7 3-1 4-2 7-5 3-8 1-6 2-7 4-5 8-1 6-3 5-2 7-4 8-6 1-5 3-7 2-8 4-6 7-1 5-3 6-2 8-4'),
}

/** Largest pool the generator orders: beyond it a pool is too long to fence in a day and the search slows. */
export const MAX_POOL_SIZE = 20

function hasTable(size: number): size is keyof typeof POOL_ORDER_TABLES {
  return size in POOL_ORDER_TABLES
}

/** The bout order for a pool: the table for 4 to 8, a generated order for other sizes. */
export function poolOrder(size: number): Pair[] {
  return hasTable(size) ? [...POOL_ORDER_TABLES[size]] : generateOrder(size)
}

function requirePoolSize(size: number): void {
  if (!Number.isInteger(size) || size < 2 || size > MAX_POOL_SIZE) {
    throw new Error(`A pool order needs 2 to ${MAX_POOL_SIZE} fighters, not ${size}`)
  }
}

/**
 * The most rest every fighter can be given. r matches of rest means any r + 1 consecutive
 * matches hold 2(r + 1) different fighters, so 2(r + 1) ≤ n; for an even n equality would make
 * every n/2 matches a full round and repeat a pair, so one less.
 */
function restBound(size: number): number {
  if (size <= 3) return 0
  return size % 2 === 1 ? (size - 3) / 2 : size / 2 - 2
}

// Search effort per rest level before settling for one match less of rest; keeps the largest
// pools to a few tens of milliseconds.
const SEARCH_BUDGET = 20_000

/**
 * A round robin order for any pool of 2 to 20 that gives everyone as much rest as it can find:
 * a depth-first search that always tries first the pair whose fighters have rested longest,
 * aiming at the most rest possible and lowering the aim when the search runs out of effort.
 * Reproducible: the same size always gives the same order. For 3 fighters a back-to-back match
 * cannot be avoided (every match shares a fighter with the next); for 4 neither (two matches in
 * a row without a shared fighter use all four, so a third would repeat a pair).
 */
export function generateOrder(size: number): Pair[] {
  requirePoolSize(size)
  for (let rest = restBound(size); rest > 0; rest--) {
    const found = searchOrder(size, rest, SEARCH_BUDGET)
    if (found) return balanceSides(found)
  }
  return balanceSides(searchOrder(size, 0, Infinity)!)
}

function searchOrder(size: number, rest: number, budget: number): Pair[] | null {
  const all: Pair[] = []
  for (let a = 1; a <= size; a++) {
    for (let b = a + 1; b <= size; b++) all.push([a, b])
  }
  const total = all.length
  const used = all.map(() => false)
  // A fighter who has not fought yet counts as rested longer than anyone who has.
  const last = Array.from({ length: size + 1 }, () => -total - 1)
  const left = Array.from({ length: size + 1 }, () => size - 1)
  const order: number[] = []
  let nodes = 0

  const waited = (fighter: number, at: number) => at - last[fighter]! - 1
  // Everyone still to fight must fit their remaining matches, spaced by the rest, before the end.
  const canFinish = (at: number) => {
    for (let f = 1; f <= size; f++) {
      if (left[f] === 0) continue
      const next = Math.max(at, last[f]! + rest + 1)
      if (next + (left[f]! - 1) * (rest + 1) > total - 1) return false
    }
    return true
  }

  const extend = (): boolean => {
    const at = order.length
    if (at === total) return true
    if (++nodes > budget || !canFinish(at)) return false
    const candidates: number[] = []
    all.forEach(([a, b], i) => {
      if (!used[i] && waited(a, at) >= rest && waited(b, at) >= rest) candidates.push(i)
    })
    const score = (i: number) => {
      const [a, b] = all[i]!
      return [Math.min(waited(a, at), waited(b, at)), left[a]! + left[b]!] as const
    }
    candidates.sort((x, y) => {
      const [sx, tx] = score(x)
      const [sy, ty] = score(y)
      return sy - sx || ty - tx || x - y
    })
    for (const i of candidates) {
      const [a, b] = all[i]!
      const lastA = last[a]!
      const lastB = last[b]!
      used[i] = true
      order.push(i)
      last[a] = at
      last[b] = at
      left[a] = left[a]! - 1
      left[b] = left[b]! - 1
      if (extend()) return true
      used[i] = false
      order.pop()
      last[a] = lastA
      last[b] = lastB
      left[a] = left[a]! + 1
      left[b] = left[b]! + 1
      if (nodes > budget) return false
    }
    return false
  }

  return extend() ? order.map(i => all[i]!) : null
}

/**
 * Sides chosen so that each fighter takes the first side as often as the second, or one time
 * more or less: first alternating each fighter's side as the order goes, then turning pairs
 * round from the fighter with the most first sides to the one with the fewest.
 */
function balanceSides(order: readonly Pair[]): Pair[] {
  const firsts = new Map<number, number>()
  const lastSide = new Map<number, 'first' | 'second'>()
  const out: [number, number][] = order.map(([a, b]) => {
    const fa = firsts.get(a) ?? 0
    const fb = firsts.get(b) ?? 0
    let pair: [number, number] = [a, b]
    if (fa !== fb) pair = fa < fb ? [a, b] : [b, a]
    else if (lastSide.get(b) === 'second' && lastSide.get(a) !== 'second') pair = [b, a]
    const [first, second] = pair
    firsts.set(first, (firsts.get(first) ?? 0) + 1)
    lastSide.set(first, 'first')
    lastSide.set(second, 'second')
    return pair
  })
  const fighters = [...new Set(order.flat())]
  const flip = (i: number) => {
    const [a, b] = out[i]!
    out[i] = [b, a]
    firsts.set(b, (firsts.get(b) ?? 0) + 1)
    firsts.set(a, firsts.get(a)! - 1)
  }
  const firstIn = (x: number, y: number) => out.findIndex(([a, b]) => a === x && b === y)
  for (;;) {
    const byFirsts = [...fighters].sort((x, y) => (firsts.get(y) ?? 0) - (firsts.get(x) ?? 0) || x - y)
    const most = byFirsts[0]!
    const fewest = byFirsts[byFirsts.length - 1]!
    if ((firsts.get(most) ?? 0) - (firsts.get(fewest) ?? 0) <= 1) break
    const direct = firstIn(most, fewest)
    if (direct >= 0) {
      flip(direct)
      continue
    }
    // Through a third fighter: most over via, via over fewest; via keeps their count.
    const via = fighters.find(z => firstIn(most, z) >= 0 && firstIn(z, fewest) >= 0)
    if (via === undefined) break
    flip(firstIn(most, via))
    flip(firstIn(via, fewest))
  }
  return out
}

export interface RestStats {
  /** Fewest matches any fighter sits out between two of their own; null if nobody fights twice. */
  minRest: number | null
  meanRest: number | null
  maxRest: number | null
  /** How many times a fighter goes straight from one match into the next. */
  backToBack: number
}

/** Rest, in matches sat out, between each fighter's consecutive matches. */
export function restStats(order: readonly Pair[]): RestStats {
  const last = new Map<number, number>()
  const rests: number[] = []
  order.forEach((pair, i) => {
    for (const fighter of pair) {
      const before = last.get(fighter)
      if (before !== undefined) rests.push(i - before - 1)
      last.set(fighter, i)
    }
  })
  if (rests.length === 0) return { minRest: null, meanRest: null, maxRest: null, backToBack: 0 }
  return {
    minRest: Math.min(...rests),
    meanRest: rests.reduce((sum, r) => sum + r, 0) / rests.length,
    maxRest: Math.max(...rests),
    backToBack: rests.filter(r => r === 0).length,
  }
}

/** Puts fighter ids in place of positions: position 1 is fighterIds[0]. */
export function toPairings(order: readonly Pair[], fighterIds: readonly number[]): Pairing[] {
  const highest = Math.max(0, ...order.flat())
  if (fighterIds.length !== highest) {
    throw new Error(`The order is for ${highest} fighters but ${fighterIds.length} were given`)
  }
  if (new Set(fighterIds).size !== fighterIds.length) throw new Error('A fighter is listed twice')
  return order.map(([a, b]) => {
    if (a < 1 || b < 1) throw new Error(`Positions start at 1, not ${Math.min(a, b)}`)
    return [fighterIds[a - 1]!, fighterIds[b - 1]!] as const
  })
}
