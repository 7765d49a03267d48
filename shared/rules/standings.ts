import type { MatchEntry, Side } from './entries'
import { drawLot } from './lot'
import type { LotDraw } from './lot'
import { deriveMatch } from './match'
import type { MatchResult, MatchState } from './match'
import type { RuleSet, TieBreaker } from './ruleset'

export interface PoolFighter {
  id: string
  /** Withdrawn by the organiser (injury, left the event). */
  withdrawn?: boolean
  /** Expelled elsewhere in the event; a black card in this pool's log expels as well. */
  expelled?: boolean
}

interface PoolMatchBase {
  id: string
  a: string
  b: string
  entries: readonly MatchEntry[]
}

/**
 * A match of the pool. `unfought` also covers a match under way: its entries are read for the
 * qualification outlook and for black cards, but it counts in the table only once `finished`.
 */
export type PoolMatch = PoolMatchBase & ({ status: 'finished' | 'unfought' } | { status: 'forfeit', forfeitedBy: Side })

export interface Pool {
  fighters: readonly PoolFighter[]
  matches: readonly PoolMatch[]
  /** Seeds the drawn lot; store it with the pool so the lot can be drawn again. */
  lotSeed: string
}

/** How a match counts: its fought result, a forfeit, removed from the table, or not yet. */
export type MatchCount = 'result' | 'forfeit' | 'annulled' | 'pending'

export interface MatchOutcome {
  matchId: string
  a: string
  b: string
  counted: MatchCount
  result: MatchResult | null
  forfeitedBy: Side | 'both' | null
  score: { a: number, b: number } | null
}

export interface FighterCards {
  warnings: number
  yellows: number
  reds: number
  blacks: number
}

/** What puts a fighter above the one ranked next: a tie-breaker, the lot, or standing (still in the pool above withdrawn or expelled). */
export type Separation = TieBreaker | 'lot' | 'standing'

export interface StandingRow {
  fighterId: string
  rank: number
  withdrawn: boolean
  expelled: boolean
  /** Still in the pool: neither withdrawn nor expelled. */
  active: boolean
  matchesFought: number
  wins: number
  losses: number
  draws: number
  forfeitWins: number
  forfeitLosses: number
  boutsFought: number
  unharmedBouts: number
  hitBouts: number
  /** unharmed ÷ bouts fought; null before the first bout. */
  survivalRate: number | null
  pointsScored: number
  pointsReceived: number
  indicator: number
  doubles: number
  afterblowsReceived: number
  cards: FighterCards
  separatedBy: Separation | null
}

export interface Standings {
  rows: StandingRow[]
  lot: { seed: string, draws: LotDraw[] }
  matches: MatchOutcome[]
}

export interface FighterInfo {
  id: string
  withdrawn: boolean
  expelled: boolean
  active: boolean
  /** Withdrawn under annul-all (and not expelled): every match with them is removed. */
  annulled: boolean
}

export interface PreparedMatch {
  match: PoolMatch
  state: MatchState
  outcome: MatchOutcome
}

export interface PreparedPool {
  fighters: Map<string, FighterInfo>
  /** Sorted by match id. */
  matches: PreparedMatch[]
}

function forfeit(outcome: MatchOutcome, by: Side | 'both'): void {
  outcome.counted = 'forfeit'
  outcome.forfeitedBy = by
  outcome.result = by === 'both' ? 'both-lose' : by === 'a' ? 'b' : 'a'
}

/** Derives every match once and decides how each counts. Throws on a malformed pool. */
export function preparePool(ruleSet: RuleSet, pool: Pool): PreparedPool {
  const fighters = new Map<string, FighterInfo>()
  for (const f of pool.fighters) {
    if (fighters.has(f.id)) throw new Error(`Fighter ${f.id} is in the pool twice`)
    fighters.set(f.id, { id: f.id, withdrawn: f.withdrawn === true, expelled: f.expelled === true, active: true, annulled: false })
  }
  const seen = new Set<string>()
  const derived = pool.matches.map((match) => {
    if (seen.has(match.id)) throw new Error(`Match ${match.id} is in the pool twice`)
    seen.add(match.id)
    if (!fighters.has(match.a) || !fighters.has(match.b)) throw new Error(`Match ${match.id} names a fighter who is not in the pool`)
    if (match.a === match.b) throw new Error(`Match ${match.id} puts ${match.a} against themselves`)
    return { match, state: deriveMatch(ruleSet, match.entries) }
  })
  for (const { match, state } of derived) {
    if (state.sides.a.cards.black) fighters.get(match.a)!.expelled = true
    if (state.sides.b.cards.black) fighters.get(match.b)!.expelled = true
  }
  for (const f of fighters.values()) {
    f.active = !f.withdrawn && !f.expelled
    f.annulled = f.withdrawn && !f.expelled && ruleSet.withdrawn === 'annul-all'
  }

  const matches = derived.map(({ match, state }): PreparedMatch => {
    const a = fighters.get(match.a)!
    const b = fighters.get(match.b)!
    const outcome: MatchOutcome = { matchId: match.id, a: a.id, b: b.id, counted: 'pending', result: null, forfeitedBy: null, score: null }
    if (a.annulled || b.annulled) {
      outcome.counted = 'annulled'
    }
    else if (match.status === 'finished') {
      outcome.counted = 'result'
      const { points: pa } = state.sides.a
      const { points: pb } = state.sides.b
      // The director's word ends a match (e.g. time called off the log); the score then stands.
      outcome.result = state.result ?? (pa > pb ? 'a' : pb > pa ? 'b' : 'draw')
      outcome.score = { a: pa, b: pb }
    }
    else if (match.status === 'forfeit') {
      forfeit(outcome, match.forfeitedBy)
    }
    else if (!a.active || !b.active) {
      forfeit(outcome, !a.active && !b.active ? 'both' : !a.active ? 'a' : 'b')
    }
    return { match, state, outcome }
  })
  matches.sort((x, y) => (x.match.id < y.match.id ? -1 : x.match.id > y.match.id ? 1 : 0))
  return { fighters, matches }
}

function emptyRow(f: FighterInfo): StandingRow {
  return {
    fighterId: f.id,
    rank: 0,
    withdrawn: f.withdrawn,
    expelled: f.expelled,
    active: f.active,
    matchesFought: 0,
    wins: 0,
    losses: 0,
    draws: 0,
    forfeitWins: 0,
    forfeitLosses: 0,
    boutsFought: 0,
    unharmedBouts: 0,
    hitBouts: 0,
    survivalRate: null,
    pointsScored: 0,
    pointsReceived: 0,
    indicator: 0,
    doubles: 0,
    afterblowsReceived: 0,
    cards: { warnings: 0, yellows: 0, reds: 0, blacks: 0 },
    separatedBy: null,
  }
}

function tallyRows(prepared: PreparedPool): Map<string, StandingRow> {
  const rows = new Map<string, StandingRow>()
  for (const f of prepared.fighters.values()) rows.set(f.id, emptyRow(f))
  for (const { state, outcome } of prepared.matches) {
    if (outcome.counted !== 'result' && outcome.counted !== 'forfeit') continue
    for (const side of ['a', 'b'] as const) {
      const row = rows.get(outcome[side])!
      const other = side === 'a' ? 'b' : 'a'
      if (outcome.result === side) row.wins++
      else if (outcome.result === 'draw') row.draws++
      else row.losses++
      if (outcome.counted === 'forfeit') {
        if (outcome.result === side) row.forfeitWins++
        else row.forfeitLosses++
        continue
      }
      const own = state.sides[side]
      row.matchesFought++
      row.boutsFought += state.bouts
      row.unharmedBouts += own.unharmedBouts
      row.hitBouts += own.hitBouts
      row.pointsScored += own.points
      row.pointsReceived += state.sides[other].points
      row.doubles += state.doubles
      row.afterblowsReceived += own.afterblowsReceived
      row.cards.warnings += own.cards.warnings
      row.cards.yellows += own.cards.yellows
      row.cards.reds += own.cards.reds
      if (own.cards.black) row.cards.blacks++
    }
  }
  for (const row of rows.values()) {
    row.indicator = row.pointsScored - row.pointsReceived
    row.survivalRate = row.boutsFought > 0 ? row.unharmedBouts / row.boutsFought : null
  }
  return rows
}

/** The value a tie-breaker compares, higher first. */
function keyOf(row: StandingRow, criterion: Exclude<TieBreaker, 'headToHead'>): number {
  switch (criterion) {
    case 'unharmedBouts': return row.unharmedBouts
    case 'survivalRate': return row.survivalRate ?? -1
    case 'wins': return row.wins
    case 'indicator': return row.indicator
    case 'pointsScored': return row.pointsScored
    case 'pointsReceived': return -row.pointsReceived
    case 'doubles': return -row.doubles
  }
}

function byId(x: StandingRow, y: StandingRow): number {
  return x.fighterId < y.fighterId ? -1 : x.fighterId > y.fighterId ? 1 : 0
}

/** Splits a group into runs of equal value, best run first. */
function runs(group: StandingRow[], value: (row: StandingRow) => number): StandingRow[][] {
  const sorted = [...group].sort((x, y) => value(y) - value(x) || byId(x, y))
  const parts: StandingRow[][] = []
  let last = Number.NaN
  for (const row of sorted) {
    const v = value(row)
    if (parts.length === 0 || v !== last) parts.push([])
    parts[parts.length - 1]!.push(row)
    last = v
  }
  return parts
}

interface Placed {
  row: StandingRow
  below: Separation | null
}

function ranker(ruleSet: RuleSet, prepared: PreparedPool, seed: string, draws: LotDraw[]) {
  const criteria = ruleSet.ranking
  const decided = prepared.matches
    .filter(m => m.outcome.counted === 'result' || m.outcome.counted === 'forfeit')
    .map(m => m.outcome)

  // Mini-table: wins in the matches the tied fighters had among themselves.
  const headToHead = (group: StandingRow[]) => {
    const members = new Set(group.map(r => r.fighterId))
    const wins = new Map<string, number>()
    for (const m of decided) {
      if (!members.has(m.a) || !members.has(m.b)) continue
      if (m.result === 'a') wins.set(m.a, (wins.get(m.a) ?? 0) + 1)
      else if (m.result === 'b') wins.set(m.b, (wins.get(m.b) ?? 0) + 1)
    }
    return runs(group, row => wins.get(row.fighterId) ?? 0)
  }

  const order = (group: StandingRow[], level: number): Placed[] => {
    if (group.length === 1) return [{ row: group[0]!, below: null }]
    const criterion = criteria[level]
    if (criterion === undefined) {
      const draw = drawLot(seed, group.map(r => r.fighterId))
      draws.push(draw)
      const rows = new Map(group.map(r => [r.fighterId, r]))
      return draw.order.map((id, i) => ({ row: rows.get(id)!, below: i < draw.order.length - 1 ? 'lot' : null }))
    }
    const parts = criterion === 'headToHead' ? headToHead(group) : runs(group, row => keyOf(row, criterion))
    if (parts.length === 1) return order(group, level + 1)
    // A mini-table that split the group is drawn again among those still level.
    const next = criterion === 'headToHead' ? level : level + 1
    const placed: Placed[] = []
    parts.forEach((part, i) => {
      const inner = order(part, next)
      if (i < parts.length - 1) inner[inner.length - 1]!.below = criterion
      placed.push(...inner)
    })
    return placed
  }
  return order
}

/** Rows ranked by the rule set, the lot last. Fighters still in the pool come before the others. */
export function rankPrepared(ruleSet: RuleSet, prepared: PreparedPool, seed: string): Standings {
  const rows = [...tallyRows(prepared).values()].sort(byId)
  const draws: LotDraw[] = []
  const order = ranker(ruleSet, prepared, seed, draws)
  const active = rows.filter(r => r.active)
  const gone = rows.filter(r => !r.active)
  const placed = [...(active.length > 0 ? order(active, 0) : []), ...(gone.length > 0 ? order(gone, 0) : [])]
  if (active.length > 0 && gone.length > 0) placed[active.length - 1]!.below = 'standing'
  const ranked = placed.map(({ row, below }, i) => ({ ...row, rank: i + 1, separatedBy: below }))
  return { rows: ranked, lot: { seed, draws }, matches: prepared.matches.map(m => m.outcome) }
}

/** The pool table: every fighter's numbers, ranked by the rule set's tie-breakers, then the lot. */
export function computeStandings(ruleSet: RuleSet, pool: Pool): Standings {
  return rankPrepared(ruleSet, preparePool(ruleSet, pool), pool.lotSeed)
}
