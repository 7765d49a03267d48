import { ACTIONS, TARGETS } from '#shared/rules'
import type { Action, CardColour, MatchEntry, MatchState, RuleSet, Side, Target } from '#shared/rules'

// One match and its log of entries (routes under …/tournaments/:tournamentId/matches).

/** An entry as the result form builds it, before it gets its id. */
export type NewMatchEntry = DistributiveOmit<MatchEntry, 'id' | 'at'>
type DistributiveOmit<T, K extends PropertyKey> = T extends unknown ? Omit<T, K> : never

export interface StoredMatchEntry {
  id: string
  seq: number
  payload: MatchEntry
  recordedAt: string
}

export interface MatchDetail {
  match: MatchSummary
  entries: StoredMatchEntry[]
  state: MatchState
  rules: RuleSet
}

export interface MatchEntriesResponse {
  match: MatchSummary
  state: MatchState
  /** Ids of the entries this request stored. */
  stored: string[]
  /** Ids the match already held, skipped. */
  duplicates: string[]
}

export function useMatch(base: MaybeRefOrGetter<string>, matchId: MaybeRefOrGetter<number>) {
  return useFetch<MatchDetail>(() => `${toValue(base)}/matches/${toValue(matchId)}`, {
    key: () => `match-${toValue(base)}-${toValue(matchId)}`,
  })
}

export function useMatchList(base: MaybeRefOrGetter<string>, key: MaybeRefOrGetter<string>, query: MaybeRefOrGetter<{ poolId?: number, stage?: MatchStage }> = {}) {
  return useFetch<{ matches: MatchSummary[] }>(() => `${toValue(base)}/matches`, {
    key: () => `matches-${toValue(key)}-${JSON.stringify(toValue(query))}`,
    query,
  })
}

export const TARGET_NAMES: Record<Target, string> = {
  head: 'Head',
  torso: 'Torso',
  arms: 'Arms',
  hands: 'Hands',
  legs: 'Legs',
}

export const ACTION_NAMES: Record<Action, string> = {
  cut: 'Cut',
  thrust: 'Thrust',
}

export const CARD_NAMES = {
  warning: 'Warning',
  yellow: 'Yellow card',
  red: 'Red card',
  black: 'Black card',
} as const

/** The card buttons of the result form and the ring desk, with the key that picks each on the desk. */
export const CARD_BUTTONS: readonly { colour: CardColour, label: string, key: string, tone: string }[] = [
  { colour: 'warning', label: 'Warning', key: 'W', tone: 'border-ink-300 bg-white text-ink-900' },
  { colour: 'yellow', label: 'Yellow', key: 'Y', tone: 'border-brass-400 bg-brass-100 text-ink-900' },
  { colour: 'red', label: 'Red', key: 'R', tone: 'border-rust-600 bg-rust-100 text-rust-700' },
  { colour: 'black', label: 'Black', key: 'K', tone: 'border-ink-900 bg-ink-900 text-paper' },
]

export const END_REASON_NAMES: Record<string, string> = {
  'bouts': 'all bouts fenced',
  'points': 'points reached',
  'time': 'time up',
  'double-out': 'double-out',
  'expelled': 'black card',
  'forfeit': 'conceded',
}

/** One button of a hit grid: a target, and the action where it matters. */
export interface HitChoice {
  target: Target
  action: Action
  /** False when the grid shows one button for both actions (they score the same). */
  split: boolean
  allowed: boolean
  points: number
  /** The digit that picks it (1 head … 5 legs), with Shift for a thrust where cut and thrust score differently. */
  digit: number
  shift: boolean
}

/**
 * The buttons of a hit grid. `all`: a button per target and action (the result form); `scored`: a
 * button per target, split into cut and thrust only where the rule set scores them differently
 * (the ring desk, where every tap counts). An unsplit button records a cut.
 */
export function hitChoices(rules: RuleSet, mode: 'all' | 'scored' = 'all'): HitChoice[] {
  return TARGETS.flatMap((target, i) => {
    const values = rules.targets[target]
    const split = mode === 'all' || values.cut !== values.thrust
    const actions: readonly Action[] = split ? ACTIONS : ['cut']
    return actions.map(action => ({
      target, action, split, allowed: values.allowed, points: values[action], digit: i + 1, shift: split && action === 'thrust',
    }))
  })
}

/** The hit a key picks in a `scored` grid: 1–5 for the targets, Shift for a thrust where it scores differently. */
export function hitForKey(rules: RuleSet, event: Pick<KeyboardEvent, 'code' | 'shiftKey'>): { target: Target, action: Action } | null {
  const digit = /^(?:Digit|Numpad)([1-5])$/.exec(event.code)?.[1]
  if (!digit) return null
  const target = TARGETS[Number(digit) - 1]!
  const values = rules.targets[target]
  if (!values.allowed) return null
  return { target, action: event.shiftKey && values.cut !== values.thrust ? 'thrust' : 'cut' }
}

function hitWords(hit: { target: Target, action: Action }): string {
  return `${TARGET_NAMES[hit.target].toLowerCase()}, ${ACTION_NAMES[hit.action].toLowerCase()}`
}

/** One line of the log in words, e.g. "Hedda Crane hit: head, cut". */
export function describeEntry(entry: MatchEntry, names: Record<Side, string>, targetOf?: (id: string) => MatchEntry | undefined): string {
  switch (entry.kind) {
    case 'clean':
      return `${names[entry.side]} hit: ${hitWords(entry)}`
    case 'afterblow':
      return `${names[entry.side]} hit first (${hitWords(entry)}), afterblow by ${names[entry.side === 'a' ? 'b' : 'a']} (${hitWords(entry.afterblow)})`
    case 'double':
      return `Double: ${names.a} ${hitWords(entry.a)}; ${names.b} ${hitWords(entry.b)}`
    case 'void':
      return entry.reason === 'not-seen' ? 'Not seen: fenced again' : 'No valid hit: fenced again'
    case 'card':
      return `${CARD_NAMES[entry.colour]} for ${names[entry.side]}`
    case 'ring-out':
      return `${names[entry.side]} left the ring`
    case 'time-up':
      return 'Time up'
    case 'concede':
      return `${names[entry.side]} conceded the match`
    case 'cancel': {
      const target = targetOf?.(entry.targetId)
      return target ? `Taken back: ${describeEntry(target, names, targetOf)}` : 'Taken back: an earlier entry'
    }
  }
}

/** "Hedda Crane wins 5–2 (all bouts fenced)" and the like. */
export function describeResult(state: MatchState, names: Record<Side, string>): string {
  const score = `${state.sides.a.points}–${state.sides.b.points}`
  const why = state.endReason ? ` (${END_REASON_NAMES[state.endReason] ?? state.endReason})` : ''
  if (!state.finished) return `Not finished yet: ${score}`
  if (state.result === 'a' || state.result === 'b') return `${names[state.result]} wins ${score}${why}`
  if (state.result === 'both-lose') return `Both lose ${score}${why}`
  return `Draw ${score}${why}`
}

/** An id for a new entry of a match's log: the server stores an id once, so a resent entry is not counted twice. */
export function newEntryId(): string {
  if (typeof crypto !== 'undefined' && typeof crypto.randomUUID === 'function') return crypto.randomUUID()
  // Browsers without randomUUID (an insecure context): still random enough for one match's log.
  const bytes = new Uint8Array(16)
  crypto.getRandomValues(bytes)
  return Array.from(bytes, b => b.toString(16).padStart(2, '0')).join('')
}
