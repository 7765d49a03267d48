import { bergerOrder } from './berger'
import { poolOrder, toPairings } from './order'
import type { Pairing } from './types'

function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n >= 1 && (n & (n - 1)) === 0
}

/** The smallest power of two that holds the field. */
export function bracketSize(fieldSize: number): number {
  let size = 1
  while (size < fieldSize) size *= 2
  return size
}

/**
 * Seeds from top to bottom of a bracket (common practice): each first-round match pairs seed s
 * with size + 1 − s, and the order is built so that 1 and 2 can only meet in the final, 1 to 4
 * only in the semifinals, and so on. For 8: 1, 8, 4, 5, 2, 7, 3, 6.
 */
export function seedOrder(size: number): number[] {
  if (!isPowerOfTwo(size) || size < 2) throw new Error(`A bracket size is a power of two from 2, not ${size}`)
  let order = [1]
  for (let width = 2; width <= size; width *= 2) {
    order = order.flatMap(seed => [seed, width + 1 - seed])
  }
  return order
}

/** Final, semifinal, quarterfinal, then round of 16, 32 and so on. */
export function roundName(round: number, roundCount: number): string {
  const fighters = 2 ** (roundCount - round + 1)
  if (fighters === 2) return 'Final'
  if (fighters === 4) return 'Semifinal'
  if (fighters === 8) return 'Quarterfinal'
  return `Round of ${fighters}`
}

export const BRONZE_MATCH_ID = 'bronze'

export interface BracketSide {
  fighterId: number | null
  /** The fighter's seed, carried with them from round to round. */
  seed: number | null
  /** The empty side of a first-round bye. */
  bye: boolean
}

/** waiting: a side is still to be decided; bye: no opponent, the fighter went through. */
export type BracketMatchStatus = 'waiting' | 'ready' | 'done' | 'bye'

export interface BracketLink {
  matchId: string
  side: 0 | 1
}

export interface BracketMatch {
  /** `r{round}m{slot + 1}`, or `bronze`. */
  id: string
  kind: 'main' | 'bronze'
  /** 1 is the first round; the bronze match shares the final's round. */
  round: number
  /** 0-based place within the round, from the top. */
  slot: number
  name: string
  sides: [BracketSide, BracketSide]
  winnerId: number | null
  loserId: number | null
  status: BracketMatchStatus
  winnerTo: BracketLink | null
  loserTo: BracketLink | null
}

export interface Bracket {
  fieldSize: number
  /** The next power of two; the difference is the number of byes. */
  size: number
  roundCount: number
  bronze: boolean
  matches: BracketMatch[]
}

export interface BracketOptions {
  /** A match for third place between the semifinal losers. */
  bronze?: boolean
}

const matchId = (round: number, slot: number) => `r${round}m${slot + 1}`
const emptySide = (): BracketSide => ({ fighterId: null, seed: null, bye: false })

/**
 * An elimination bracket for a ranked field (best first) of any size from 2. The top seeds get
 * the byes, and a bye goes through on its own.
 */
export function buildBracket(rankedFighterIds: readonly number[], options: BracketOptions = {}): Bracket {
  const fieldSize = rankedFighterIds.length
  if (fieldSize < 2) throw new Error(`A bracket needs at least 2 fighters, not ${fieldSize}`)
  if (new Set(rankedFighterIds).size !== fieldSize) throw new Error('A fighter is ranked twice')
  const bronze = options.bronze ?? false
  if (bronze && fieldSize < 4) throw new Error(`A bronze match needs two semifinal losers, so at least 4 fighters, not ${fieldSize}`)

  const size = bracketSize(fieldSize)
  const roundCount = Math.log2(size)
  const order = seedOrder(size)
  const seedSide = (seed: number): BracketSide => seed <= fieldSize
    ? { fighterId: rankedFighterIds[seed - 1]!, seed, bye: false }
    : { fighterId: null, seed: null, bye: true }

  const matches: BracketMatch[] = []
  for (let round = 1; round <= roundCount; round++) {
    const count = size / 2 ** round
    for (let slot = 0; slot < count; slot++) {
      const isSemifinal = round === roundCount - 1
      matches.push({
        id: matchId(round, slot),
        kind: 'main',
        round,
        slot,
        name: roundName(round, roundCount),
        sides: round === 1 ? [seedSide(order[2 * slot]!), seedSide(order[2 * slot + 1]!)] : [emptySide(), emptySide()],
        winnerId: null,
        loserId: null,
        status: 'waiting',
        winnerTo: round < roundCount ? { matchId: matchId(round + 1, Math.floor(slot / 2)), side: slot % 2 === 0 ? 0 : 1 } : null,
        loserTo: bronze && isSemifinal ? { matchId: BRONZE_MATCH_ID, side: slot % 2 === 0 ? 0 : 1 } : null,
      })
    }
  }
  if (bronze) {
    matches.push({
      id: BRONZE_MATCH_ID,
      kind: 'bronze',
      round: roundCount,
      slot: 1,
      name: 'Bronze match',
      sides: [emptySide(), emptySide()],
      winnerId: null,
      loserId: null,
      status: 'waiting',
      winnerTo: null,
      loserTo: null,
    })
  }

  const byId = new Map(matches.map(m => [m.id, m]))
  for (const match of matches) {
    const [a, b] = match.sides
    if (!a.bye && !b.bye) continue
    // More than half the bracket is filled, so a bye never meets a bye.
    const through = a.bye ? b : a
    match.winnerId = through.fighterId
    match.status = 'bye'
    if (match.winnerTo) place(byId, match.winnerTo, through)
  }
  refreshStatuses(matches)
  return { fieldSize, size, roundCount, bronze, matches }
}

function place(byId: ReadonlyMap<string, BracketMatch>, link: BracketLink, side: BracketSide): void {
  const target = byId.get(link.matchId)!
  target.sides[link.side] = { fighterId: side.fighterId, seed: side.seed, bye: false }
}

function refreshStatuses(matches: BracketMatch[]): void {
  for (const match of matches) {
    if (match.status === 'bye') continue
    if (match.winnerId !== null) match.status = 'done'
    else if (match.sides.every(side => side.fighterId !== null)) match.status = 'ready'
    else match.status = 'waiting'
  }
}

function copyMatches(bracket: Bracket): BracketMatch[] {
  return bracket.matches.map(m => ({
    ...m,
    sides: [{ ...m.sides[0] }, { ...m.sides[1] }],
    winnerTo: m.winnerTo && { ...m.winnerTo },
    loserTo: m.loserTo && { ...m.loserTo },
  }))
}

function findMatch(bracket: Bracket, id: string): BracketMatch {
  const match = bracket.matches.find(m => m.id === id)
  if (!match) throw new Error(`There is no match ${id} in this bracket`)
  return match
}

/**
 * The bracket after a match is won: the winner moves on and, when there is a bronze match, a
 * semifinal loser goes to it. The bracket given is left as it was.
 */
export function advance(bracket: Bracket, id: string, winnerId: number): Bracket {
  const match = findMatch(bracket, id)
  if (match.status === 'bye') throw new Error(`Match ${id} is a bye; the fighter went through on their own`)
  if (match.status === 'done') throw new Error(`Match ${id} is already decided`)
  if (match.status === 'waiting') throw new Error(`Match ${id} is not ready: a side is still to be decided`)
  const winnerSide = match.sides.findIndex(side => side.fighterId === winnerId)
  if (winnerSide < 0) throw new Error(`Fighter ${winnerId} is not in match ${id}`)

  const matches = copyMatches(bracket)
  const byId = new Map(matches.map(m => [m.id, m]))
  const next = byId.get(id)!
  const winner = next.sides[winnerSide]!
  const loser = next.sides[1 - winnerSide]!
  next.winnerId = winner.fighterId
  next.loserId = loser.fighterId
  if (next.winnerTo) place(byId, next.winnerTo, winner)
  if (next.loserTo) place(byId, next.loserTo, loser)
  refreshStatuses(matches)
  return { ...bracket, matches }
}

/**
 * The bracket with a decided match opened again (a scorekeeper's undo). Refused once a match
 * it fed has been decided: undo that one first.
 */
export function reopen(bracket: Bracket, id: string): Bracket {
  const match = findMatch(bracket, id)
  if (match.status !== 'done') throw new Error(`Match ${id} is not decided, so there is nothing to reopen`)
  for (const link of [match.winnerTo, match.loserTo]) {
    if (link && findMatch(bracket, link.matchId).status === 'done') {
      throw new Error(`Match ${link.matchId} has been decided since; reopen it first`)
    }
  }
  const matches = copyMatches(bracket)
  const byId = new Map(matches.map(m => [m.id, m]))
  const next = byId.get(id)!
  next.winnerId = null
  next.loserId = null
  for (const link of [next.winnerTo, next.loserTo]) {
    if (link) byId.get(link.matchId)!.sides[link.side] = emptySide()
  }
  refreshStatuses(matches)
  return { ...bracket, matches }
}

/** Matches with both fighters known and no result, in the order to fight them (bronze before the final). */
export function readyMatches(bracket: Bracket): BracketMatch[] {
  return bracket.matches
    .filter(m => m.status === 'ready')
    .sort((a, b) => a.round - b.round || (a.kind === b.kind ? a.slot - b.slot : a.kind === 'bronze' ? -1 : 1))
}

export interface BracketPlaces {
  first: number | null
  second: number | null
  /** The bronze winner, or both semifinal losers when there is no bronze match. */
  third: number[]
  fourth: number | null
}

/** Places decided so far. */
export function bracketPlaces(bracket: Bracket): BracketPlaces {
  const final = bracket.matches.find(m => m.kind === 'main' && m.round === bracket.roundCount)!
  const bronze = bracket.matches.find(m => m.kind === 'bronze')
  const semifinalLosers = bracket.matches
    .filter(m => m.kind === 'main' && m.round === bracket.roundCount - 1 && m.loserId !== null)
    .map(m => m.loserId!)
  return {
    first: final.winnerId,
    second: final.loserId,
    third: bronze ? (bronze.winnerId === null ? [] : [bronze.winnerId]) : semifinalLosers,
    fourth: bronze?.loserId ?? null,
  }
}

export type RoundRobinMethod = 'pool-table' | 'berger'

/**
 * The alternative to a bracket: the finalists (often the final four) fence a round robin, by
 * the pool order tables or by the Berger tables, positions given by their ranking.
 */
export function roundRobinFinal(rankedFighterIds: readonly number[], method: RoundRobinMethod = 'pool-table'): Pairing[] {
  const count = rankedFighterIds.length
  const order = method === 'berger' ? bergerOrder(count) : poolOrder(count)
  return toPairings(order, rankedFighterIds)
}
