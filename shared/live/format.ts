// Words and numbers the boards, the cue desk and the public live page show. Pure and small: the
// overlay page loads this in the browser.
import type { Side } from '../rules'
import type { Board, LiveCard, LiveMatch, LiveRecord } from './types'
import { clockElapsed } from './reduce'

export const BOARD_LABELS: Readonly<Record<Board, string>> = {
  'bout': 'Bout bar',
  'up-next': 'Up next',
  'pool': 'Pool board',
  'bracket': 'Bracket board',
  'winner': 'Winner board',
  'none': 'Clear screen',
}

/** 0.6667 → "67%" (whole percents, for the boards); nothing fought yet → "–". */
export function roundPercent(rate: number | null | undefined): string {
  return rate === null || rate === undefined ? '–' : `${Math.round(rate * 100)}%`
}

/** Where a match stands in its tournament: "Pool 2", "Semifinal". */
export function stageLabel(match: Pick<LiveCard, 'stage' | 'poolNumber' | 'roundName'>): string {
  return match.stage === 'pool' ? `Pool ${match.poolNumber ?? ''}`.trim() : match.roundName ?? 'Finals'
}

/** 83_000 → "1:23"; negative times count as zero. */
export function clockText(ms: number): string {
  const seconds = Math.max(0, Math.ceil(ms / 1000))
  return `${Math.floor(seconds / 60)}:${String(seconds % 60).padStart(2, '0')}`
}

/** The time left on a points match's clock, or the time run when it has no limit; null without a clock. */
export function clockShown(match: LiveMatch, now: number): string | null {
  if (!match.clock) return null
  const run = clockElapsed(match.clock, now)
  return clockText(match.clock.limitMs === null ? run : match.clock.limitMs - run)
}

/** "Bout 2 of 3" (first hit) or "Exchange 5" (points): the one being fenced, or the last one once over. */
export function boutLabel(match: LiveMatch): string {
  const done = match.bouts.length
  if (match.format === 'first-hit') {
    const of = match.boutsPerMatch ?? done
    return `Bout ${Math.min(of, match.finished ? done : done + 1)} of ${of}`
  }
  return match.pointsToWin ? `First to ${match.pointsToWin}` : `Exchange ${done + (match.finished ? 0 : 1)}`
}

/**
 * The fewest further unharmed bouts a fighter needs for the survival-rate cut, with the bouts of
 * the match on the ring taken off (the pool record counts a match only once it is over). Null
 * when there is no such cut or it is out of reach.
 */
export function liveNeed(record: LiveRecord | undefined, match: LiveMatch | null, side: Side): number | null {
  if (!record || record.need === null) return null
  const counted = match && !match.finished && match.stage === 'pool' ? match.unharmed[side] : 0
  return Math.max(0, record.need - counted)
}

/** What a fighter's need means, in a few words. */
export function needText(need: number | null): string {
  if (need === null) return ''
  if (need === 0) return 'Cut reached'
  return `Needs ${need} unharmed`
}

/** The mark of one bout on the strip, for one fighter. */
export type BoutMark = 'clear' | 'hit' | 'double' | 'open'

const MARK_WORDS: Readonly<Record<BoutMark, string>> = { clear: 'unharmed', hit: 'hit', double: 'double', open: 'to fence' }

/** The marks in words, for screen readers: "unharmed, hit, to fence". */
export function marksText(marks: readonly BoutMark[]): string {
  return marks.map(k => MARK_WORDS[k]).join(', ') || 'none yet'
}

/**
 * One mark per bout for a fighter: unharmed (`clear`), validly hit, hit in a double, and for the
 * first-hit format the bouts still to fence (`open`). The points format keeps the last `max`.
 */
export function boutMarks(match: LiveMatch, side: Side, max = 12): BoutMark[] {
  const marks: BoutMark[] = match.bouts.map(b => (b.kind === 'double' ? 'double' : b.hit[side] ? 'hit' : 'clear'))
  if (match.format === 'first-hit' && match.boutsPerMatch && !match.finished) {
    while (marks.length < match.boutsPerMatch) marks.push('open')
  }
  return marks.slice(-max)
}
