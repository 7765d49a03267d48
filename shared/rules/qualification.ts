import type { RuleSet } from './ruleset'
import { preparePool, rankPrepared } from './standings'
import type { Pool, Standings } from './standings'

export type CutStatus = 'secured' | 'reachable' | 'out'

/**
 * How a top-N status was found: `final` (nothing left to fence: the rank itself), `exact` (exact
 * for the first tie-breaker, see `countOutlook`), `bounds` (each fighter's best and worst alone,
 * see `boundOutlook`), `open` (the first tie-breaker cannot be bounded; always `reachable`).
 */
export type TopNBasis = 'final' | 'exact' | 'bounds' | 'open'

export interface FighterOutlook {
  fighterId: string
  rank: number
  active: boolean
  remainingMatches: number
  /** Bouts still to fence, counting every bout of every unfinished match; null in the points format, where the number of exchanges is open. */
  remainingBouts: number | null
  topN: { status: CutStatus, basis: TopNBasis } | null
  /**
   * The survival-rate cut. `need`: the fewest further unharmed bouts that bring the rate to the cut
   * once every remaining bout is fenced; 0 when already sure, null when out of reach or, in the
   * points format, when the number of exchanges left is open.
   */
  survival: { status: CutStatus, need: number | null } | null
  /** Both cuts together: secured only when every cut set is secured, out when any is out. */
  status: CutStatus
}

export interface QualificationOutlook {
  topN: number | null
  minSurvivalRate: number | null
  /** No match of the pool is still to be decided. */
  complete: boolean
  fighters: FighterOutlook[]
  standings: Standings
}

interface Verdict {
  secured: boolean
  out: boolean
  basis: TopNBasis
}

/** A pair of fighters (indexes) and how many units (bouts or matches) they still have together. */
type Units = [number, number, number][]

// Hall checks a search may make for one fighter before it settles for the bound.
const SEARCH_BUDGET = 200_000

/**
 * Top-N outlook for a count tie-breaker (unharmed bouts, wins) from the current counts and the
 * units still to be decided. The model: every remaining unit between x and y ends with +1 for x,
 * +1 for y, or nothing for either, independently of every other unit. For unharmed bouts that is
 * exactly what a bout can do (clean hit by one, or both hit); for wins it is a little wider than
 * real (a draw or a double-out is taken to be always possible).
 *
 * Ties on the first tie-breaker are taken as able to go either way, since later tie-breakers and
 * the lot may turn on bouts not yet fenced. Under that model the answer is exact:
 * - `secured` ⇔ in every completion fewer than n rivals reach the fighter's count;
 * - `out` ⇔ in every completion at least n rivals end strictly above the fighter.
 * As the real completions are a subset of the model's, both verdicts hold for the real ranking.
 * If the search for the worst case runs past SEARCH_BUDGET, `secured` falls back to the bound of
 * `boundOutlook` (still sound, no longer exact) and the basis says `bounds`.
 */
export function countOutlook(base: readonly number[], units: Units, n: number): Verdict[] {
  const size = base.length
  const pair: number[][] = Array.from({ length: size }, () => Array.from({ length: size }, () => 0))
  const touching = Array.from({ length: size }, () => 0)
  for (const [x, y, c] of units) {
    pair[x]![y]! += c
    pair[y]![x]! += c
    touching[x]! += c
    touching[y]! += c
  }

  return base.map((own, f) => {
    // Best case: the fighter takes every own unit and rivals share nothing among themselves.
    const best = own + touching[f]!
    let above = 0
    for (let r = 0; r < size; r++) if (r !== f && base[r]! > best) above++
    const out = above >= n

    // Worst case: the fighter takes nothing, every own unit goes to the rival, and the units
    // between rivals are handed out to lift as many rivals as possible to the fighter's count.
    const demand: number[] = []
    let free = 0
    const rivals: number[] = []
    for (let r = 0; r < size; r++) {
      if (r === f) continue
      const need = own - (base[r]! + pair[f]![r]!)
      if (need <= 0) {
        free++
        continue
      }
      if (need <= touching[r]! - pair[f]![r]!) {
        rivals.push(r)
        demand.push(need)
      }
    }
    if (free >= n) return { secured: false, out, basis: 'exact' }
    const wanted = n - free
    if (rivals.length < wanted) return { secured: true, out, basis: 'exact' }

    const fallback = (): Verdict => {
      let reach = 0
      for (let r = 0; r < size; r++) if (r !== f && base[r]! + touching[r]! >= own) reach++
      return { secured: reach < n, out, basis: 'bounds' }
    }
    if (rivals.length > 30) return fallback()

    const order = rivals.map((r, i) => ({ r, d: demand[i]! })).sort((p, q) => p.d - q.d)
    const slot = new Map(order.map((o, i) => [o.r, i]))
    const masks: number[] = []
    const counts: number[] = []
    for (const [x, y, c] of units) {
      if (x === f || y === f) continue
      const mask = (slot.has(x) ? 1 << slot.get(x)! : 0) | (slot.has(y) ? 1 << slot.get(y)! : 0)
      if (mask !== 0) {
        masks.push(mask)
        counts.push(c)
      }
    }
    const need = order.map(o => o.d)
    let checks = 0
    let exhausted = false

    // Hall's condition for the chosen rivals: every subset's demand fits the units touching it.
    // Only subsets with the newest member are checked; the others passed before.
    const fits = (chosen: number[], newest: number): boolean => {
      const k = chosen.length
      for (let sub = 0; sub < 1 << k; sub++) {
        if (++checks > SEARCH_BUDGET) {
          exhausted = true
          return false
        }
        let mask = 1 << newest
        let sum = need[newest]!
        for (let i = 0; i < k; i++) {
          if (sub & (1 << i)) {
            mask |= 1 << chosen[i]!
            sum += need[chosen[i]!]!
          }
        }
        let supply = 0
        for (let u = 0; u < masks.length; u++) if (masks[u]! & mask) supply += counts[u]!
        if (sum > supply) return false
      }
      return true
    }
    const chosen: number[] = []
    const search = (from: number): boolean => {
      if (chosen.length === wanted) return true
      for (let i = from; i <= order.length - (wanted - chosen.length); i++) {
        if (fits(chosen, i)) {
          chosen.push(i)
          if (search(i + 1)) return true
          chosen.pop()
        }
        if (exhausted) return false
      }
      return false
    }
    const lifted = search(0)
    if (exhausted) return fallback()
    return { secured: !lifted, out, basis: 'exact' }
  })
}

/**
 * Top-N outlook from each fighter's lowest and highest possible value taken alone (ties open, as
 * in `countOutlook`): `secured` when fewer than n rivals can reach the fighter's lowest value,
 * `out` when at least n rivals are sure to stay above the fighter's highest. Sound (never wrong
 * when it says secured or out) but not exact: it ignores that two rivals cannot both win the
 * bouts they fence against each other.
 */
export function boundOutlook(low: readonly number[], high: readonly number[], n: number): Verdict[] {
  return low.map((lowest, f) => {
    let reach = 0
    let above = 0
    for (let r = 0; r < low.length; r++) {
      if (r === f) continue
      if (high[r]! >= lowest) reach++
      if (low[r]! > high[f]!) above++
    }
    return { secured: reach < n, out: above >= n, basis: 'bounds' }
  })
}

function meetsRate(unharmed: number, bouts: number, min: number): boolean {
  return bouts > 0 && unharmed / bouts >= min
}

/** The fewest of `left` further bouts that must be unharmed to reach the rate; null if none do. */
export function survivalNeed(unharmed: number, bouts: number, left: number, min: number): number | null {
  for (let extra = 0; extra <= left; extra++) {
    if (meetsRate(unharmed + extra, bouts + left, min)) return extra
  }
  return null
}

function combine(statuses: CutStatus[]): CutStatus {
  if (statuses.includes('out')) return 'out'
  return statuses.every(s => s === 'secured') ? 'secured' : 'reachable'
}

/**
 * Who can still qualify from a pool, and what each fighter needs. The completions considered are
 * the outcomes of the bouts still to fence; further cards, withdrawals and expulsions are not
 * foreseen. The standings come with it, derived once.
 */
export function assessQualification(ruleSet: RuleSet, pool: Pool): QualificationOutlook {
  const prepared = preparePool(ruleSet, pool)
  const standings = rankPrepared(ruleSet, prepared, pool.lotSeed)
  const { topN, minSurvivalRate } = ruleSet.qualification
  const firstHit = ruleSet.format === 'first-hit'

  const active = standings.rows.filter(r => r.active)
  const index = new Map(active.map((r, i) => [r.fighterId, i]))
  const unharmed = active.map(r => r.unharmedBouts)
  const bouts = active.map(r => r.boutsFought)
  const wins = active.map(r => r.wins)
  const matchesLeft = active.map(() => 0)
  const boutsLeft = active.map(() => 0)
  const boutUnits: Units = []
  const matchUnits: Units = []
  let complete = true

  for (const { state, outcome } of prepared.matches) {
    if (outcome.counted !== 'pending') continue
    complete = false
    const a = index.get(outcome.a)!
    const b = index.get(outcome.b)!
    unharmed[a]! += state.sides.a.unharmedBouts
    unharmed[b]! += state.sides.b.unharmedBouts
    bouts[a]! += state.bouts
    bouts[b]! += state.bouts
    if (state.finished) {
      if (state.result === 'a') wins[a]!++
      if (state.result === 'b') wins[b]!++
      continue
    }
    matchesLeft[a]!++
    matchesLeft[b]!++
    matchUnits.push([a, b, 1])
    if (ruleSet.format === 'first-hit') {
      const left = Math.max(0, ruleSet.boutsPerMatch - state.bouts)
      boutsLeft[a]! += left
      boutsLeft[b]! += left
      if (left > 0) boutUnits.push([a, b, left])
    }
  }

  let verdicts: Verdict[] | null = null
  if (topN !== null) {
    const key = ruleSet.ranking[0]
    const rate = (u: number, f: number) => (f > 0 ? u / f : -1)
    if (complete) {
      verdicts = active.map((_, i) => ({ secured: i < topN, out: i >= topN, basis: 'final' }))
    }
    else if (key === 'wins') {
      verdicts = countOutlook(wins, matchUnits, topN)
    }
    else if (key === 'unharmedBouts' && firstHit) {
      verdicts = countOutlook(unharmed, boutUnits, topN)
    }
    else if (key === 'unharmedBouts') {
      verdicts = boundOutlook(unharmed, unharmed.map((u, i) => (matchesLeft[i]! > 0 ? Infinity : u)), topN)
    }
    else if (key === 'survivalRate' && firstHit) {
      verdicts = boundOutlook(
        active.map((_, i) => rate(unharmed[i]!, bouts[i]! + boutsLeft[i]!)),
        active.map((_, i) => rate(unharmed[i]! + boutsLeft[i]!, bouts[i]! + boutsLeft[i]!)),
        topN,
      )
    }
    else if (key === 'survivalRate') {
      verdicts = boundOutlook(
        active.map((_, i) => (matchesLeft[i]! > 0 ? -1 : rate(unharmed[i]!, bouts[i]!))),
        active.map((_, i) => (matchesLeft[i]! > 0 ? 1 : rate(unharmed[i]!, bouts[i]!))),
        topN,
      )
    }
    else {
      verdicts = active.map(() => ({ secured: false, out: false, basis: 'open' }))
    }
    if (active.length <= topN) verdicts = verdicts.map(v => ({ ...v, secured: true, out: false }))
  }

  const fighters = standings.rows.map((row): FighterOutlook => {
    const i = index.get(row.fighterId)
    if (i === undefined) {
      return {
        fighterId: row.fighterId,
        rank: row.rank,
        active: false,
        remainingMatches: 0,
        remainingBouts: firstHit ? 0 : null,
        topN: topN === null ? null : { status: 'out', basis: 'final' },
        survival: minSurvivalRate === null ? null : { status: 'out', need: null },
        status: 'out',
      }
    }
    const verdict = verdicts?.[i]
    const topStatus = verdict === undefined ? null : { status: verdict.secured ? 'secured' as const : verdict.out ? 'out' as const : 'reachable' as const, basis: verdict.basis }

    let survival: FighterOutlook['survival'] = null
    if (minSurvivalRate !== null) {
      const u = unharmed[i]!
      const f = bouts[i]!
      const left = firstHit ? boutsLeft[i]! : matchesLeft[i]! > 0 ? null : 0
      if (left === null) {
        survival = { status: 'reachable', need: null }
      }
      else {
        const status: CutStatus = meetsRate(u, f + left, minSurvivalRate)
          ? 'secured'
          : meetsRate(u + left, f + left, minSurvivalRate) ? 'reachable' : 'out'
        survival = { status, need: survivalNeed(u, f, left, minSurvivalRate) }
      }
    }
    const parts = [topStatus?.status, survival?.status].filter((s): s is CutStatus => s !== undefined)
    return {
      fighterId: row.fighterId,
      rank: row.rank,
      active: true,
      remainingMatches: matchesLeft[i]!,
      remainingBouts: firstHit ? boutsLeft[i]! : null,
      topN: topStatus,
      survival,
      status: combine(parts),
    }
  })

  return { topN, minSurvivalRate, complete, fighters, standings }
}
