import { describe, expect, it } from 'vitest'
import { WINNER_BOARD_MS, autoBoard, boardOnAir, learnOffset } from '../../../shared/live/reduce'
import { boutLabel, boutMarks, clockShown, liveNeed, marksText, needText, roundPercent, stageLabel } from '../../../shared/live/format'
import type { LiveCard, LiveMatch, LiveRecord, RingLive } from '../../../shared/live/types'

// Invented fighters of the demo's invented clubs.
const T0 = Date.parse('2026-09-12T10:00:00.000Z')
const at = (ms: number) => new Date(T0 + ms).toISOString()

function match(patch: Partial<LiveMatch> = {}): LiveMatch {
  return {
    id: 1, version: 1, tournamentId: 7, tournamentName: 'Sword and buckler', weapon: 'sword and buckler',
    stage: 'pool', poolNumber: 2, roundName: null, ring: 1, format: 'first-hit', boutsPerMatch: 3, pointsToWin: null,
    sideA: { entryId: 11, name: 'Hedda Crane', clubName: 'Ironquay Fencing Hall' },
    sideB: { entryId: 12, name: 'Alder Mossley', clubName: 'North Downs Buckler Circle' },
    status: 'under-way', score: { a: 0, b: 0 }, bouts: [], voids: 0, doubles: 0,
    cards: { a: { warnings: 0, yellows: 0, reds: 0, black: false }, b: { warnings: 0, yellows: 0, reds: 0, black: false } },
    unharmed: { a: 0, b: 0 }, fought: { a: 0, b: 0 }, finished: false, result: null, endReason: null, winner: null,
    forfeitedBy: null, clock: null, startedAt: at(0), finishedAt: null,
    ...patch,
  }
}

const card: LiveCard = { id: 2, tournamentName: 'Sword and buckler', stage: 'pool', poolNumber: 2, roundName: null, sideA: null, sideB: null, startsAt: null }

function ring(patch: Partial<RingLive> = {}): RingLive {
  return {
    eventId: 1, eventName: 'Wrenmouth Harvest Open', ring: 1, seq: 1, at: at(0), board: { onAir: 'bout', mode: 'auto' },
    match: null, lastFinished: null, onDeck: null, next: null, pool: null, finals: null, ...patch,
  }
}

describe('automatic mode', () => {
  it('shows the bout bar while a match is on the ring', () => {
    expect(autoBoard(ring({ match: match(), onDeck: card }), T0 + 60_000)).toBe('bout')
  })

  it('shows the winner board for 8 seconds after a match ends, then what is up next', () => {
    const ended = match({ finished: true, status: 'finished', winner: 'a', finishedAt: at(30_000) })
    const r = ring({ match: ended, lastFinished: ended, onDeck: card })
    expect(WINNER_BOARD_MS).toBe(8000)
    expect(autoBoard(r, T0 + 30_000)).toBe('winner')
    expect(autoBoard(r, T0 + 30_000 + WINNER_BOARD_MS - 1)).toBe('winner')
    expect(autoBoard(r, T0 + 30_000 + WINNER_BOARD_MS)).toBe('up-next')
  })

  it('keeps the winner board of the last match when the ring has moved on to nothing yet', () => {
    const ended = match({ finished: true, status: 'finished', winner: 'b', finishedAt: at(0) })
    expect(autoBoard(ring({ lastFinished: ended, next: card }), T0 + 2000)).toBe('winner')
    expect(autoBoard(ring({ lastFinished: ended, next: card }), T0 + 9000)).toBe('up-next')
  })

  it('falls back to the bracket, then the pool, then a clear screen when nothing is called', () => {
    const pool = { tournamentId: 7, tournamentName: 'Sword and buckler', poolNumber: 2, complete: true, rows: [], cut: { topN: 4, minSurvivalRate: null } }
    const finals = { tournamentId: 7, tournamentName: 'Sword and buckler', format: 'bracket' as const, roundCount: 2, matches: [], table: [], places: { first: null, second: null, third: [] } }
    expect(autoBoard(ring({ pool, finals }), T0)).toBe('bracket')
    expect(autoBoard(ring({ pool }), T0)).toBe('pool')
    expect(autoBoard(ring(), T0)).toBe('none')
  })

  it('follows the streamer\'s choice in manual mode, whatever the match does', () => {
    const r = ring({ match: match(), board: { onAir: 'pool', mode: 'manual' } })
    expect(boardOnAir(r, T0)).toBe('pool')
    expect(boardOnAir({ ...r, board: { onAir: 'pool', mode: 'auto' } }, T0)).toBe('bout')
  })
})

describe('what the boards write', () => {
  it('marks every bout per fighter, with the bouts still to fence in the first-hit format', () => {
    const m = match({
      bouts: [
        { n: 1, hit: { a: false, b: true }, kind: 'clean', by: 'a', points: { a: 1, b: 0 } },
        { n: 2, hit: { a: true, b: true }, kind: 'double', by: null, points: { a: 0, b: 0 } },
      ],
    })
    expect(boutMarks(m, 'a')).toEqual(['clear', 'double', 'open'])
    expect(boutMarks(m, 'b')).toEqual(['hit', 'double', 'open'])
    expect(marksText(boutMarks(m, 'a'))).toBe('unharmed, double, to fence')
    expect(marksText([])).toBe('none yet')
    expect(boutLabel(m)).toBe('Bout 3 of 3')
  })

  it('keeps only the latest exchanges of a points match', () => {
    const bouts = Array.from({ length: 10 }, (_, i) => ({ n: i + 1, hit: { a: i % 2 === 0, b: i % 2 === 1 }, kind: 'clean' as const, by: null, points: { a: 0, b: 0 } }))
    const m = match({ format: 'points', boutsPerMatch: null, pointsToWin: 7, bouts })
    expect(boutMarks(m, 'a', 4)).toEqual(['hit', 'clear', 'hit', 'clear'])
    expect(boutLabel(m)).toBe('First to 7')
  })

  it('shows the time left on a running match clock from the server\'s time', () => {
    const m = match({ format: 'points', clock: { runningSince: at(0), elapsedMs: 30_000, limitMs: 180_000 } })
    expect(clockShown(m, T0 + 15_000)).toBe('2:15')
    expect(clockShown(m, T0 + 400_000)).toBe('0:00')
    expect(clockShown(match(), T0)).toBeNull()
  })

  it('takes the unharmed bouts of the match on the ring off what a fighter needs for the cut', () => {
    const record = { need: 3 } as LiveRecord
    expect(liveNeed(record, match({ unharmed: { a: 2, b: 0 } }), 'a')).toBe(1)
    expect(liveNeed(record, match({ unharmed: { a: 5, b: 0 } }), 'a')).toBe(0)
    expect(liveNeed(record, match({ unharmed: { a: 2, b: 0 }, finished: true }), 'a')).toBe(3)
    expect(liveNeed({ need: null } as LiveRecord, match(), 'a')).toBeNull()
    expect(needText(0)).toBe('Cut reached')
    expect(needText(2)).toBe('Needs 2 unharmed')
  })

  it('writes survival rates in whole percents and names the stage of a match', () => {
    expect(roundPercent(2 / 3)).toBe('67%')
    expect(roundPercent(null)).toBe('–')
    expect(stageLabel(card)).toBe('Pool 2')
    expect(stageLabel({ stage: 'final', poolNumber: null, roundName: 'Semifinal' })).toBe('Semifinal')
  })
})

describe('the server clock a browser learns from the stream', () => {
  const local = Date.parse('2026-10-10T12:00:10.000Z')
  it('takes the first stamp as it is, even one behind this browser', () => {
    expect(learnOffset(null, '2026-10-10T12:00:08.000Z', local)).toBe(-2000)
  })
  it('keeps a fresher stamp and ignores a stored snapshot made minutes ago', () => {
    const fromReplay = learnOffset(null, '2026-10-10T11:56:10.000Z', local)
    expect(fromReplay).toBe(-240_000)
    const fresh = learnOffset(fromReplay, '2026-10-10T12:00:10.500Z', local)
    expect(fresh).toBe(500)
    expect(learnOffset(fresh, '2026-10-10T11:59:00.000Z', local)).toBe(500)
  })
})
