import type { Action, MatchEntry, MatchState, RuleSet, Side, Target } from '#shared/rules'

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

export const END_REASON_NAMES: Record<string, string> = {
  'bouts': 'all bouts fenced',
  'points': 'points reached',
  'time': 'time up',
  'double-out': 'double-out',
  'expelled': 'black card',
  'forfeit': 'conceded',
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
