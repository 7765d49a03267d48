import { assign } from './assignment'
import { shuffleWithKey } from './random'
import type { Entry } from './types'

export const DEFAULT_MIN_POOL_SIZE = 2

export interface PoolPlan {
  poolCount: number
  /** Largest first; sizes differ by at most one. */
  sizes: number[]
}

export interface PlanOptions {
  /** Fewest fighters a pool may hold (default 2). */
  minSize?: number
  /** Most fighters a pool may hold; adds pools when the target would exceed it. */
  maxSize?: number
}

function requireInteger(value: number, name: string, min: number): void {
  if (!Number.isInteger(value) || value < min) {
    throw new Error(`${name} must be a whole number of at least ${min}, not ${value}`)
  }
}

/**
 * How many pools, and how large, for a number of entries and a wanted pool size: the pool
 * count whose average comes closest to the target, then sizes as even as possible.
 */
export function planPools(entryCount: number, targetSize: number, options: PlanOptions = {}): PoolPlan {
  const minSize = options.minSize ?? DEFAULT_MIN_POOL_SIZE
  requireInteger(minSize, 'The smallest pool size', 2)
  requireInteger(entryCount, 'The number of entries', 0)
  requireInteger(targetSize, 'The pool size', 1)
  if (targetSize < minSize) {
    throw new Error(`A pool size of ${targetSize} is below the smallest allowed pool of ${minSize}`)
  }
  if (entryCount < minSize) {
    throw new Error(`${entryCount} ${entryCount === 1 ? 'entry is' : 'entries are'} too few for a pool of at least ${minSize}`)
  }
  const most = Math.floor(entryCount / minSize)
  let poolCount = Math.min(most, Math.max(1, Math.round(entryCount / targetSize)))
  if (options.maxSize !== undefined) {
    requireInteger(options.maxSize, 'The largest pool size', minSize)
    const fewest = Math.ceil(entryCount / options.maxSize)
    if (fewest > most) {
      throw new Error(`${entryCount} entries cannot be split into pools of ${minSize} to ${options.maxSize}`)
    }
    poolCount = Math.max(poolCount, fewest)
  }
  return { poolCount, sizes: evenSizes(entryCount, poolCount) }
}

function evenSizes(total: number, parts: number): number[] {
  const base = Math.floor(total / parts)
  const extra = total % parts
  return Array.from({ length: parts }, (_, i) => base + (i < extra ? 1 : 0))
}

export type PoolNoteKind = 'more-fighters-than-pools' | 'kept-for-seeding' | 'separation-off'

/** A place where fighters of one club had to stay together; the organizer sees every one. */
export interface PoolNote {
  kind: PoolNoteKind
  /** 0-based pool index. */
  pool: number
  clubId: number
  fighterIds: number[]
  message: string
}

/** A fighter placed in another pool than the plain serpentine would have given (0-based pools). */
export interface PoolMove {
  fighterId: number
  from: number
  to: number
}

export interface PoolDraw {
  /** Pools in order; within a pool, entries by seed band, so position 1 is the best seed. */
  pools: Entry[][]
  notes: PoolNote[]
  moves: PoolMove[]
}

export interface DrawOptions {
  /** Fixes the order of the unseeded entries: the same key and entries give the same pools. */
  drawKey?: string
  minSize?: number
  /** Part fighters of the same club where the seeding allows (default true). */
  separateClubs?: boolean
}

function checkEntries(entries: readonly Entry[]): void {
  const ids = new Set<number>()
  const seeds = new Set<number>()
  for (const entry of entries) {
    if (ids.has(entry.id)) throw new Error(`Fighter ${entry.id} is entered twice`)
    ids.add(entry.id)
    if (entry.seed !== null) {
      if (!Number.isInteger(entry.seed) || entry.seed < 1) {
        throw new Error(`Fighter ${entry.id} has seed ${entry.seed}; seeds are whole numbers from 1`)
      }
      if (seeds.has(entry.seed)) throw new Error(`Seed ${entry.seed} is given to two fighters`)
      seeds.add(entry.seed)
    }
  }
}

/** Seeded entries by seed, then the unseeded in an order fixed by the draw key. */
export function drawOrder(entries: readonly Entry[], drawKey = ''): Entry[] {
  checkEntries(entries)
  const seeded = entries.filter(e => e.seed !== null).sort((a, b) => a.seed! - b.seed!)
  // Sorting first makes the shuffle independent of the order the entries arrived in.
  const unseeded = entries.filter(e => e.seed === null).sort((a, b) => a.id - b.id)
  return [...seeded, ...shuffleWithKey(unseeded, drawKey)]
}

/** The pool (0-based) of the k-th entry in draw order: 1, 2, 3, then 3, 2, 1, and so on. */
export function serpentinePool(k: number, poolCount: number): number {
  const row = Math.floor(k / poolCount)
  const column = k % poolCount
  return row % 2 === 0 ? column : poolCount - 1 - column
}

interface Slot {
  entry: Entry
  row: number
  /** Place within the row in draw order: neighbours in a row are neighbouring seeds. */
  rank: number
  serpentine: number
  pool: number
}

/**
 * Deal entries into pools: seeds in serpentine order, the unseeded after them in a reproducible
 * order, then fighters of one club parted by exchanges within a serpentine row (the same seed
 * band). Every pool where a club could not be parted gets a note.
 */
export function drawPools(entries: readonly Entry[], poolCount: number, options: DrawOptions = {}): PoolDraw {
  const minSize = options.minSize ?? DEFAULT_MIN_POOL_SIZE
  requireInteger(minSize, 'The smallest pool size', 2)
  requireInteger(poolCount, 'The number of pools', 1)
  if (entries.length < poolCount * minSize) {
    throw new Error(`${entries.length} entries cannot fill ${poolCount} pools of at least ${minSize}`)
  }
  const slots: Slot[] = drawOrder(entries, options.drawKey ?? '').map((entry, k) => {
    const pool = serpentinePool(k, poolCount)
    return { entry, row: Math.floor(k / poolCount), rank: k % poolCount, serpentine: pool, pool }
  })
  const separate = options.separateClubs ?? true
  if (separate) separateClubs(slots, poolCount)

  const pools: Entry[][] = Array.from({ length: poolCount }, () => [])
  for (const slot of slots) pools[slot.pool]!.push(slot.entry)
  const moves = slots
    .filter(slot => slot.pool !== slot.serpentine)
    .map(slot => ({ fighterId: slot.entry.id, from: slot.serpentine, to: slot.pool }))
  return { pools, notes: clubNotes(pools, entries, separate), moves }
}

function clubCounts(slots: readonly Slot[], poolCount: number): Map<number, number>[] {
  const counts = Array.from({ length: poolCount }, () => new Map<number, number>())
  for (const slot of slots) {
    const club = slot.entry.clubId
    if (club === null) continue
    const pool = counts[slot.pool]!
    pool.set(club, (pool.get(club) ?? 0) + 1)
  }
  return counts
}

/** Pairs of same-club fighters sharing a pool, and how far the draw strayed from the serpentine. */
function drawCost(slots: readonly Slot[], poolCount: number): [number, number] {
  let clashes = 0
  for (const pool of clubCounts(slots, poolCount)) {
    for (const n of pool.values()) clashes += n * (n - 1) / 2
  }
  const rankOfPool = new Map<string, number>(slots.map(s => [`${s.row}:${s.serpentine}`, s.rank]))
  let displacement = 0
  for (const slot of slots) displacement += Math.abs(slot.rank - rankOfPool.get(`${slot.row}:${slot.pool}`)!)
  return [clashes, displacement]
}

function separateClubs(slots: Slot[], poolCount: number): void {
  const rows: Slot[][] = []
  for (const slot of slots) (rows[slot.row] ??= []).push(slot)

  // Row by row, the best exchange of pools within the row given the rows above it.
  const placed: Slot[] = []
  for (const row of rows) {
    const pools = row.map(slot => slot.serpentine)
    const counts = clubCounts(placed, poolCount)
    const big = row.length * row.length + 1
    const cost = row.map(slot => row.map((target) => {
      const club = slot.entry.clubId
      const clash = club === null ? 0 : counts[target.serpentine]!.get(club) ?? 0
      return clash * big + Math.abs(slot.rank - target.rank)
    }))
    const chosen = assign(cost)
    row.forEach((slot, i) => {
      slot.pool = pools[chosen[i]!]!
    })
    placed.push(...row)
  }

  // Then single exchanges anywhere, while one still lowers the clashes (or, at equal clashes,
  // the distance from the serpentine): fixes a row that boxed in the rows below it.
  let best = drawCost(slots, poolCount)
  let improved = true
  while (improved) {
    improved = false
    for (const row of rows) {
      for (let i = 0; i < row.length; i++) {
        for (let j = i + 1; j < row.length; j++) {
          const a = row[i]!
          const b = row[j]!
          swapPools(a, b)
          const cost = drawCost(slots, poolCount)
          if (cost[0] < best[0] || (cost[0] === best[0] && cost[1] < best[1])) {
            best = cost
            improved = true
          }
          else {
            swapPools(a, b)
          }
        }
      }
    }
  }
}

function swapPools(a: Slot, b: Slot): void {
  const held = a.pool
  a.pool = b.pool
  b.pool = held
}

function clubNotes(pools: readonly (readonly Entry[])[], entries: readonly Entry[], separated: boolean): PoolNote[] {
  const clubSize = new Map<number, number>()
  for (const entry of entries) {
    if (entry.clubId !== null) clubSize.set(entry.clubId, (clubSize.get(entry.clubId) ?? 0) + 1)
  }
  const notes: PoolNote[] = []
  pools.forEach((pool, index) => {
    const byClub = new Map<number, number[]>()
    for (const entry of pool) {
      if (entry.clubId !== null) byClub.set(entry.clubId, [...byClub.get(entry.clubId) ?? [], entry.id])
    }
    for (const [clubId, fighterIds] of [...byClub].sort((a, b) => a[0] - b[0])) {
      if (fighterIds.length < 2) continue
      const size = clubSize.get(clubId)!
      const unavoidable = size > pools.length && fighterIds.length <= Math.ceil(size / pools.length)
      const shared = `Pool ${index + 1} holds ${fighterIds.length} fighters of club ${clubId} (${fighterIds.join(', ')})`
      if (unavoidable) {
        notes.push({ kind: 'more-fighters-than-pools', pool: index, clubId, fighterIds, message: `${shared}: the club has ${size} fighters for ${pools.length} ${pools.length === 1 ? 'pool' : 'pools'}.` })
      }
      else if (separated) {
        notes.push({ kind: 'kept-for-seeding', pool: index, clubId, fighterIds, message: `${shared}: no exchange within their seed bands was found that parts them.` })
      }
      else {
        notes.push({ kind: 'separation-off', pool: index, clubId, fighterIds, message: `${shared}: club separation was turned off.` })
      }
    }
  })
  return notes
}

export type MoveWarningKind = 'same-club' | 'uneven-sizes'

export interface MoveWarning {
  kind: MoveWarningKind
  message: string
}

export type MoveCheck
  = | { allowed: true, pools: Entry[][], warnings: MoveWarning[] }
    | { allowed: false, reason: string }

export interface MoveOptions {
  minSize?: number
}

/**
 * Check a manual move of one fighter to another pool (0-based). Refuses a move that leaves a
 * pool too small; warns about a club meeting itself or pools drifting apart in size. When
 * allowed, gives the pools after the move, the fighter placed by seed.
 */
export function validateMove(
  pools: readonly (readonly Entry[])[],
  fighterId: number,
  toPool: number,
  options: MoveOptions = {},
): MoveCheck {
  const minSize = options.minSize ?? DEFAULT_MIN_POOL_SIZE
  const fromPool = pools.findIndex(pool => pool.some(e => e.id === fighterId))
  if (fromPool < 0) return { allowed: false, reason: `Fighter ${fighterId} is in none of the pools` }
  if (!Number.isInteger(toPool) || toPool < 0 || toPool >= pools.length) {
    return { allowed: false, reason: `There is no pool ${toPool + 1}` }
  }
  if (toPool === fromPool) return { allowed: false, reason: `Fighter ${fighterId} is already in pool ${toPool + 1}` }
  const from = pools[fromPool]!
  if (from.length - 1 < minSize) {
    return { allowed: false, reason: `Pool ${fromPool + 1} would keep ${from.length - 1} ${from.length - 1 === 1 ? 'fighter' : 'fighters'}, fewer than ${minSize}` }
  }

  const fighter = from.find(e => e.id === fighterId)!
  const to = pools[toPool]!
  const warnings: MoveWarning[] = []
  const clubmates = fighter.clubId === null ? [] : to.filter(e => e.clubId === fighter.clubId)
  if (clubmates.length > 0) {
    warnings.push({
      kind: 'same-club',
      message: `Fighter ${fighterId} joins ${clubmates.map(e => e.id).join(', ')} of the same club (${fighter.clubId}) in pool ${toPool + 1}`,
    })
  }
  const next = pools.map((pool, index) => {
    if (index === fromPool) return pool.filter(e => e.id !== fighterId)
    if (index === toPool) return insertBySeed(pool, fighter)
    return [...pool]
  })
  const sizes = next.map(pool => pool.length)
  if (Math.max(...sizes) - Math.min(...sizes) > 1) {
    warnings.push({ kind: 'uneven-sizes', message: `Pool sizes would be ${sizes.join(', ')}, differing by more than one` })
  }
  return { allowed: true, pools: next, warnings }
}

function insertBySeed(pool: readonly Entry[], entry: Entry): Entry[] {
  const at = entry.seed === null ? -1 : pool.findIndex(e => e.seed === null || e.seed > entry.seed!)
  return at < 0 ? [...pool, entry] : [...pool.slice(0, at), entry, ...pool.slice(at)]
}
