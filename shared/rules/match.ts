import { checkEntry, otherSide } from './entries'
import type { CardColour, EntryKind, MatchEntry, Side } from './entries'
import { hitValue } from './ruleset'
import type { FieldProblem, Format, RuleSet } from './ruleset'

export type EndReason = 'bouts' | 'points' | 'time' | 'double-out' | 'expelled' | 'forfeit'
/** A side wins, a draw, or both lose (double-out). */
export type MatchResult = Side | 'draw' | 'both-lose'

export interface CardRecord {
  entryId: string
  colour: CardColour
  /** A warning given by the ring-out rule rather than by the director's card. */
  fromRingOut: boolean
}

export interface CardsInForce {
  warnings: number
  yellows: number
  /** Red cards plus one for every second yellow. */
  reds: number
  black: boolean
  list: CardRecord[]
}

export interface SideState {
  points: number
  unharmedBouts: number
  hitBouts: number
  cleanHits: number
  /** Afterblows this side struck back after being hit first. */
  afterblowsLanded: number
  /** Afterblows this side took after hitting first. */
  afterblowsReceived: number
  ringOuts: number
  cards: CardsInForce
}

export type EntryStatus = 'applied' | 'cancelled' | 'ignored' | 'rejected'
export type IgnoredReason = 'duplicate' | 'after-end' | 'unknown-target'
export type CardEffect = 'recorded' | 'red' | 'expelled'

/** What one entry of the log did, for the desk's strip. */
export interface TimelineItem {
  index: number
  id: string
  kind: EntryKind
  status: EntryStatus
  reason: IgnoredReason | null
  cancelledBy: string | null
  /** The entry an applied cancel took back. */
  cancels: string | null
  problems: FieldProblem[]
  /** The counted bout (first-hit) or exchange (points) this entry was; null for everything else. */
  bout: number | null
  /** Who was validly hit in that bout. */
  hit: { a: boolean, b: boolean } | null
  points: { a: number, b: number }
  score: { a: number, b: number }
  card: { side: Side, colour: CardColour, effect: CardEffect } | null
  /** A card recorded after the match ended: it stands for discipline but changes no score. */
  afterEnd: boolean
  /** The reason the match ended, on the entry that ended it. */
  ended: EndReason | null
}

export interface MatchState {
  format: Format
  sides: { a: SideState, b: SideState }
  /** Bouts (first-hit) or exchanges (points) that count; void ones are not among them. */
  bouts: number
  voids: number
  doubles: number
  finished: boolean
  endReason: EndReason | null
  result: MatchResult | null
  /** The side ahead on points now, null when level. */
  leader: Side | null
  timeline: TimelineItem[]
}

function emptySide(): SideState {
  return {
    points: 0,
    unharmedBouts: 0,
    hitBouts: 0,
    cleanHits: 0,
    afterblowsLanded: 0,
    afterblowsReceived: 0,
    ringOuts: 0,
    cards: { warnings: 0, yellows: 0, reds: 0, black: false, list: [] },
  }
}

function afterblowPoints(ruleSet: RuleSet, first: number, after: number): [number, number] {
  switch (ruleSet.afterblow.scoring) {
    case 'full':
      return [first, after]
    // The lower value is taken from the higher; the fighter whose hit was worth more scores the rest.
    case 'difference':
      return first >= after ? [first - after, 0] : [0, after - first]
    case 'fixed':
      return [ruleSet.afterblow.firstHitPoints, ruleSet.afterblow.afterblowPoints]
  }
}

function doublePoints(ruleSet: RuleSet, a: number, b: number): [number, number] {
  switch (ruleSet.doubles.scoring) {
    case 'both':
      return [a, b]
    case 'none':
      return [0, 0]
    case 'penalty':
      return [-ruleSet.doubles.penaltyPoints, -ruleSet.doubles.penaltyPoints]
  }
}

function byPoints(a: number, b: number): Side | 'draw' {
  return a > b ? 'a' : b > a ? 'b' : 'draw'
}

interface Run {
  ruleSet: RuleSet
  sides: { a: SideState, b: SideState }
  bouts: number
  voids: number
  doubles: number
  reason: EndReason | null
  result: MatchResult | null
}

// The steps below are plain functions rather than closures made per entry: the desk and the
// standings derive thousands of entries at a time.

function endMatch(run: Run, reason: EndReason, result: MatchResult): void {
  run.reason = reason
  run.result = result
}

function score(run: Run, item: TimelineItem, side: Side, points: number): void {
  run.sides[side].points += points
  item.points[side] += points
}

function countBout(run: Run, item: TimelineItem, hitA: boolean, hitB: boolean): void {
  run.bouts++
  item.bout = run.bouts
  item.hit = { a: hitA, b: hitB }
  if (hitA) run.sides.a.hitBouts++
  else run.sides.a.unharmedBouts++
  if (hitB) run.sides.b.hitBouts++
  else run.sides.b.unharmedBouts++
}

function giveCard(run: Run, item: TimelineItem, side: Side, colour: CardColour, fromRingOut: boolean, afterEnd: boolean): void {
  const cards = run.sides[side].cards
  cards.list.push({ entryId: item.id, colour, fromRingOut })
  let effect: CardEffect = 'recorded'
  if (colour === 'warning') {
    cards.warnings++
  }
  else if (colour === 'yellow') {
    cards.yellows++
    if (cards.yellows % 2 === 0) {
      cards.reds++
      effect = 'red'
    }
  }
  else if (colour === 'red') {
    cards.reds++
    effect = 'red'
  }
  else {
    cards.black = true
    effect = 'expelled'
  }
  item.card = { side, colour, effect }
  if (afterEnd) {
    item.afterEnd = true
    return
  }
  if (effect === 'red') score(run, item, otherSide(side), run.ruleSet.cards.redPoints)
  if (effect === 'expelled') endMatch(run, 'expelled', otherSide(side))
}

function apply(run: Run, item: TimelineItem, entry: MatchEntry, afterEnd: boolean): void {
  const { ruleSet, sides } = run
  switch (entry.kind) {
    case 'clean':
      countBout(run, item, entry.side === 'b', entry.side === 'a')
      sides[entry.side].cleanHits++
      score(run, item, entry.side, hitValue(ruleSet, entry.target, entry.action))
      break
    case 'afterblow': {
      const answering = otherSide(entry.side)
      countBout(run, item, true, true)
      sides[entry.side].afterblowsReceived++
      sides[answering].afterblowsLanded++
      const [first, after] = afterblowPoints(
        ruleSet,
        hitValue(ruleSet, entry.target, entry.action),
        hitValue(ruleSet, entry.afterblow.target, entry.afterblow.action),
      )
      score(run, item, entry.side, first)
      score(run, item, answering, after)
      break
    }
    case 'double': {
      countBout(run, item, true, true)
      run.doubles++
      const [a, b] = doublePoints(
        ruleSet,
        hitValue(ruleSet, entry.a.target, entry.a.action),
        hitValue(ruleSet, entry.b.target, entry.b.action),
      )
      score(run, item, 'a', a)
      score(run, item, 'b', b)
      break
    }
    case 'void':
      run.voids++
      break
    case 'card':
      giveCard(run, item, entry.side, entry.colour, false, afterEnd)
      break
    case 'ring-out': {
      sides[entry.side].ringOuts++
      const effect = ruleSet.ringOut
      if (effect.effect === 'warning') giveCard(run, item, entry.side, 'warning', true, afterEnd)
      else if (effect.effect === 'points') score(run, item, otherSide(entry.side), effect.points)
      break
    }
    case 'time-up':
      endMatch(run, 'time', byPoints(sides.a.points, sides.b.points))
      break
    case 'concede':
      endMatch(run, 'forfeit', otherSide(entry.side))
      break
    case 'cancel':
      break
  }
}

function checkEnd(run: Run): void {
  const { ruleSet, sides } = run
  if (ruleSet.doubleOutLimit !== null && run.doubles >= ruleSet.doubleOutLimit) {
    endMatch(run, 'double-out', 'both-lose')
  }
  else if (ruleSet.format === 'first-hit' && run.bouts >= ruleSet.boutsPerMatch) {
    endMatch(run, 'bouts', byPoints(sides.a.points, sides.b.points))
  }
  else if (ruleSet.format === 'points' && ruleSet.pointsToWin !== null
    && Math.max(sides.a.points, sides.b.points) >= ruleSet.pointsToWin) {
    endMatch(run, 'points', byPoints(sides.a.points, sides.b.points))
  }
}

/**
 * The whole state of a match, derived from its log and nothing else. Total for any log: entries
 * that cannot count are kept in the timeline as cancelled, ignored (with the reason) or rejected
 * (with the problems), never dropped.
 */
export function deriveMatch(ruleSet: RuleSet, entries: readonly MatchEntry[]): MatchState {
  const count = entries.length
  const firstIndex = new Map<string, number>()
  const duplicate: boolean[] = new Array<boolean>(count).fill(false)
  for (let i = 0; i < count; i++) {
    const id = entries[i]!.id
    if (firstIndex.has(id)) duplicate[i] = true
    else firstIndex.set(id, i)
  }

  // Cancels only reach back, so walking from the end settles chains: a cancel that is itself
  // cancelled never takes its target back.
  const cancelledBy: (string | null)[] = new Array<string | null>(count).fill(null)
  const cancelTarget: (number | null)[] = new Array<number | null>(count).fill(null)
  for (let i = count - 1; i >= 0; i--) {
    const entry = entries[i]!
    if (duplicate[i] || cancelledBy[i] !== null || entry.kind !== 'cancel') continue
    const target = firstIndex.get(entry.targetId)
    if (target === undefined || target >= i) continue
    cancelTarget[i] = target
    cancelledBy[target] ??= entry.id
  }

  const run: Run = { ruleSet, sides: { a: emptySide(), b: emptySide() }, bouts: 0, voids: 0, doubles: 0, reason: null, result: null }
  const { sides } = run
  const timeline: TimelineItem[] = []

  for (let i = 0; i < count; i++) {
    const entry = entries[i]!
    const item: TimelineItem = {
      index: i,
      id: entry.id,
      kind: entry.kind,
      status: 'applied',
      reason: null,
      cancelledBy: null,
      cancels: null,
      problems: [],
      bout: null,
      hit: null,
      points: { a: 0, b: 0 },
      score: { a: sides.a.points, b: sides.b.points },
      card: null,
      afterEnd: false,
      ended: null,
    }
    timeline.push(item)

    if (duplicate[i]) {
      item.status = 'ignored'
      item.reason = 'duplicate'
      continue
    }
    if (cancelledBy[i] !== null) {
      item.status = 'cancelled'
      item.cancelledBy = cancelledBy[i]!
      continue
    }
    if (entry.kind === 'cancel') {
      const target = cancelTarget[i]
      if (target === null || target === undefined) {
        item.status = 'ignored'
        item.reason = 'unknown-target'
      }
      else {
        item.cancels = entries[target]!.id
      }
      continue
    }
    const problems = checkEntry(ruleSet, entry)
    if (problems.length > 0) {
      item.status = 'rejected'
      item.problems = problems
      continue
    }
    const finished = run.reason !== null
    if (finished && entry.kind !== 'card') {
      item.status = 'ignored'
      item.reason = 'after-end'
      continue
    }

    apply(run, item, entry, finished)
    if (!finished) {
      if (run.reason === null) checkEnd(run)
      item.ended = run.reason
    }
    item.score = { a: sides.a.points, b: sides.b.points }
  }

  const lead = byPoints(sides.a.points, sides.b.points)
  return {
    format: ruleSet.format,
    sides,
    bouts: run.bouts,
    voids: run.voids,
    doubles: run.doubles,
    finished: run.reason !== null,
    endReason: run.reason,
    result: run.result,
    leader: lead === 'draw' ? null : lead,
    timeline,
  }
}

/**
 * What appending one entry would do: its line of the timeline and the state after it. The desk
 * and the API can refuse an entry whose line would not be `applied` before it joins the log.
 */
export function previewEntry(ruleSet: RuleSet, entries: readonly MatchEntry[], entry: MatchEntry): { item: TimelineItem, state: MatchState } {
  const state = deriveMatch(ruleSet, [...entries, entry])
  return { item: state.timeline[state.timeline.length - 1]!, state }
}
