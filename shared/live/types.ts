// What the live bus carries from the ring desks to the boards, the cue desk and the public live
// page. Only type imports here: the boards load this in the browser and must stay small.
import type { CardColour, CutStatus, EndReason, Format, MatchResult, Side } from '../rules'

/** The boards a ring's overlay can show. `none` clears the screen. */
export const BOARDS = ['bout', 'up-next', 'pool', 'bracket', 'winner', 'none'] as const
export type Board = typeof BOARDS[number]

/** `auto`: the board follows the match (see `autoBoard`); `manual`: the streamer's choice stays on air. */
export const BOARD_MODES = ['auto', 'manual'] as const
export type BoardMode = typeof BOARD_MODES[number]

export interface LiveFighter {
  entryId: number
  name: string
  clubName: string
}

/** One counted bout (first-hit) or exchange (points) of a match, for the markers on the bout strip. */
export interface LiveBout {
  n: number
  /** Who was validly hit in it. */
  hit: { a: boolean, b: boolean }
  kind: 'clean' | 'afterblow' | 'double'
  /** The side that hit first (clean and afterblow). */
  by: Side | null
  points: { a: number, b: number }
}

export interface LiveCards {
  warnings: number
  yellows: number
  reds: number
  black: boolean
}

/** The server's match clock (points format). Running while `runningSince` is set. */
export interface LiveClock {
  /** ISO time the clock last started, by the server's clock; null when stopped. */
  runningSince: string | null
  /** Time run before `runningSince`. */
  elapsedMs: number
  /** The rule set's time limit; null when the match has none. */
  limitMs: number | null
}

/** A match as the desk, the boards and the public page show it; derived from its log by the rule engine. */
export interface LiveMatch {
  id: number
  /** Bumped by every change to the match (entry, forfeit, clock): a newer version always wins. */
  version: number
  tournamentId: number
  tournamentName: string
  weapon: string
  stage: 'pool' | 'final'
  poolNumber: number | null
  /** The bracket's name for a final match ("Semifinal", "Bronze match"), or "Round robin". */
  roundName: string | null
  ring: number
  format: Format
  boutsPerMatch: number | null
  pointsToWin: number | null
  sideA: LiveFighter
  sideB: LiveFighter
  status: 'scheduled' | 'under-way' | 'finished' | 'forfeit'
  score: { a: number, b: number }
  bouts: LiveBout[]
  voids: number
  doubles: number
  cards: { a: LiveCards, b: LiveCards }
  /** This match's own unharmed bouts and bouts fought, per side. */
  unharmed: { a: number, b: number }
  fought: { a: number, b: number }
  finished: boolean
  result: MatchResult | null
  endReason: EndReason | 'forfeit' | null
  /** The winning side, null while open, for a draw or when both lose. */
  winner: Side | null
  forfeitedBy: Side | null
  clock: LiveClock | null
  /** ISO times by the server's clock. */
  startedAt: string | null
  finishedAt: string | null
}

/** A fighter's line in the live pool board, and the record the bout bar and the desk show. */
export interface LiveRecord {
  entryId: number
  name: string
  clubName: string
  rank: number
  wins: number
  losses: number
  draws: number
  matchesFought: number
  /** From the matches of this pool that are over; the match on the ring is added by the boards. */
  unharmed: number
  boutsFought: number
  survivalRate: number | null
  indicator: number
  status: CutStatus | 'withdrawn' | 'expelled'
  /** The fewest further unharmed bouts that reach the survival-rate cut; null when there is none or it is out of reach. */
  need: number | null
}

export interface LivePool {
  tournamentId: number
  tournamentName: string
  poolNumber: number
  complete: boolean
  rows: LiveRecord[]
  cut: { topN: number, minSurvivalRate: number | null }
}

/** A match in the ring's queue (on deck, next) or in a bracket. */
export interface LiveCard {
  id: number
  tournamentName: string
  stage: 'pool' | 'final'
  poolNumber: number | null
  roundName: string | null
  sideA: LiveFighter | null
  sideB: LiveFighter | null
  /** Estimated start, ISO. */
  startsAt: string | null
}

export interface LiveBracketMatch {
  key: string
  round: number
  name: string
  sideA: LiveFighter | null
  sideB: LiveFighter | null
  score: { a: number, b: number } | null
  winner: Side | null
  status: 'waiting' | 'ready' | 'under-way' | 'done' | 'bye'
}

export interface LiveFinals {
  tournamentId: number
  tournamentName: string
  format: 'bracket' | 'round-robin'
  roundCount: number
  matches: LiveBracketMatch[]
  /** The round robin's table (empty for a bracket). */
  table: LiveRecord[]
  places: { first: LiveFighter | null, second: LiveFighter | null, third: LiveFighter[] }
}

/** Everything one ring's boards need, as of `seq`. */
export interface RingLive {
  eventId: number
  eventName: string
  ring: number
  /** The ring's position in its own stream. */
  seq: number
  /** ISO time the snapshot was made, by the server's clock (clients keep their offset from it). */
  at: string
  board: { onAir: Board, mode: BoardMode }
  /** The match called to the ring by its desk, else the one the schedule puts there now. */
  match: LiveMatch | null
  /** The last match that ended on this ring, for the winner board. */
  lastFinished: LiveMatch | null
  onDeck: LiveCard | null
  next: LiveCard | null
  /** The pool of the match on the ring (else of the last one), with its live table. */
  pool: LivePool | null
  /** The finals of the tournament on the ring, once it is in its finals. */
  finals: LiveFinals | null
}

/**
 * One message of a ring's stream. `ring`: a whole snapshot, sent after every change; `match`: the
 * match's new state, sent in the same transaction as the change so that the boards show a bout
 * within milliseconds; `board`: the streamer changed the board on air.
 */
export type LiveMessage
  = | { kind: 'ring', ring: number, seq: number, snapshot: RingLive }
    | { kind: 'match', ring: number, seq: number, match: LiveMatch, at: string }
    | { kind: 'board', ring: number, seq: number, board: RingLive['board'], at: string }

export type LiveKind = LiveMessage['kind']

/** Common practice, no source: fighters wear a red or a blue marker; side a takes red. */
export const SIDE_COLOURS: Readonly<Record<Side, { name: string, hex: string }>> = {
  a: { name: 'Red', hex: '#B3261E' },
  b: { name: 'Blue', hex: '#1D4F91' },
}

export type { CardColour }
