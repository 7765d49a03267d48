// How a client folds the stream into what it shows. Pure and small: the boards run it in the browser.
import type { Side } from '../rules'
import type { Board, LiveMatch, LiveMessage, LiveRecord, RingLive } from './types'

/** A match version only ever moves forward: an older copy never replaces a newer one. */
function newer(current: LiveMatch | null, incoming: LiveMatch): boolean {
  return current === null || current.id !== incoming.id || incoming.version >= current.version
}

/**
 * The ring after one message. Messages of a ring arrive in `seq` order; a repeated or older one
 * changes nothing. A snapshot replaces the ring but keeps a match state newer than its own copy
 * (a bout may overtake the snapshot made before it).
 */
export function applyLive(state: RingLive | null, message: LiveMessage): RingLive | null {
  if (message.kind === 'ring') {
    const next = message.snapshot
    if (state === null || state.ring !== next.ring) return next
    if (next.seq <= state.seq) return state
    const keep = (mine: LiveMatch | null, theirs: LiveMatch | null) =>
      mine && theirs && mine.id === theirs.id && mine.version > theirs.version ? mine : theirs
    return { ...next, match: keep(state.match, next.match), lastFinished: keep(state.lastFinished, next.lastFinished) }
  }
  if (state === null || message.seq <= state.seq) return state
  if (message.kind === 'board') return { ...state, seq: message.seq, at: message.at, board: message.board }

  const match = message.match
  let current = state.match
  let lastFinished = state.lastFinished
  if (current?.id === match.id) {
    if (!newer(current, match)) return { ...state, seq: message.seq }
    current = match
  }
  else if (lastFinished?.id === match.id) {
    if (newer(lastFinished, match)) lastFinished = match
  }
  else if (current === null || current.finished) {
    // A desk started a match the last snapshot did not know about yet.
    current = match
  }
  if (current?.finished && current.id === match.id) lastFinished = current
  return { ...state, seq: message.seq, at: message.at, match: current, lastFinished }
}

/** How long the winner board stays on air in automatic mode after a match ends. */
export const WINNER_BOARD_MS = 8000

/**
 * The board automatic mode puts on air: the bout bar while a match is on the ring, the winner
 * board for a few seconds after it ends, then what is up next. `now` is the server's time in ms.
 */
export function autoBoard(ring: RingLive, now: number): Board {
  const match = ring.match
  if (match && !match.finished) return 'bout'
  const ended = match?.finished ? match : ring.lastFinished
  if (ended?.finishedAt && now - Date.parse(ended.finishedAt) < WINNER_BOARD_MS) return 'winner'
  if (ring.onDeck || ring.next) return 'up-next'
  if (ring.finals) return 'bracket'
  return ring.pool ? 'pool' : 'none'
}

/** The board on air now: the streamer's choice, or the automatic one. */
export function boardOnAir(ring: RingLive, now: number): Board {
  return ring.board.mode === 'auto' ? autoBoard(ring, now) : ring.board.onAir
}

/**
 * A fighter's survival rate in the pool so far with the bouts of the match on the ring added
 * (the pool table counts a match only once it is over). Null before the first bout.
 */
export function liveSurvival(record: LiveRecord | undefined, match: LiveMatch | null, side: Side): { unharmed: number, fought: number, rate: number | null } {
  const counted = match && !match.finished && match.stage === 'pool'
  const unharmed = (record?.unharmed ?? 0) + (counted ? match.unharmed[side] : 0)
  const fought = (record?.boutsFought ?? 0) + (counted ? match.fought[side] : 0)
  return { unharmed, fought, rate: fought === 0 ? null : unharmed / fought }
}

/** The time on a match clock at `now` (server ms). */
export function clockElapsed(clock: { runningSince: string | null, elapsedMs: number }, now: number): number {
  return clock.elapsedMs + (clock.runningSince === null ? 0 : Math.max(0, now - Date.parse(clock.runningSince)))
}

/**
 * The offset of the server's clock from this browser's, learnt from a time the server stamped.
 * A stamp is never later than the server's now, and a replayed message or a stored snapshot can
 * be minutes old, so the largest offset seen wins: an old stamp never turns the clock back.
 */
export function learnOffset(current: number | null, stampedAt: string, localNow: number): number {
  const seen = Date.parse(stampedAt) - localNow
  return current === null || seen > current ? seen : current
}
