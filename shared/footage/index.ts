import type { MatchEntry, Side } from '../rules'

// Footage: the sizes of a multipart upload, where the desk's entries fall in a recording, the
// windows suggested for clips, and the label of each entry's mark. Pure: the server, the footage
// pages and the tests all use these.

const MiB = 1024 * 1024

/** S3's smallest part (every part but the last) and its most parts per upload (AWS S3 API reference, UploadPart). */
export const MIN_PART_BYTES = 5 * MiB
export const MAX_PARTS = 10_000
/** Our own ceiling: a long day of one ring at a high bit rate. */
export const MAX_RECORDING_BYTES = 40 * 1024 * MiB
/** Parts aimed for at most: few enough URLs to ask for, small enough parts to resume cheaply. */
const TARGET_PARTS = 1000

/** The part size for a file: 5 MiB, or whole MiB large enough to stay within 1000 parts. */
export function partSizeFor(bytes: number): number {
  return Math.max(MIN_PART_BYTES, Math.ceil(bytes / TARGET_PARTS / MiB) * MiB)
}

export function partCount(bytes: number, partSize: number): number {
  return Math.max(1, Math.ceil(bytes / partSize))
}

/** Byte range [start, end) of a part, numbered from 1. */
export function partRange(partNumber: number, partSize: number, bytes: number): [number, number] {
  const start = (partNumber - 1) * partSize
  return [start, Math.min(bytes, start + partSize)]
}

/** Part numbers not among those already uploaded. */
export function missingParts(count: number, uploaded: readonly number[]): number[] {
  const have = new Set(uploaded)
  return Array.from({ length: count }, (_, i) => i + 1).filter(n => !have.has(n))
}

export const VIDEO_CONTENT_TYPE = /^video\/[a-z0-9][a-z0-9.+-]*$/i

/**
 * Where a moment the desk recorded (server time) falls in the recording, in milliseconds from its
 * start. `offsetMs` is the commentator's correction, the same for the whole recording.
 */
export function positionInRecording(recordedAtMs: number, startsAtMs: number, offsetMs: number): number {
  return recordedAtMs - startsAtMs + offsetMs
}

/** The offset that puts a mark now at `fromMs` on `toMs`; every other mark moves by the same. */
export function offsetAfterMove(offsetMs: number, fromMs: number, toMs: number): number {
  return Math.round(offsetMs + (toMs - fromMs))
}

export const SIDE_NAMES: Record<Side, string> = { a: 'Red', b: 'Blue' }

/** Names of the kinds of mark made from the desk's entries; a club that lacks them gets them. */
export const DESK_MARK_KINDS = ['hit', 'afterblow', 'double'] as const
export type DefaultMarkKind = typeof DESK_MARK_KINDS[number]

/** The label of the mark an entry makes, and the kind it belongs to; null for a cancel. */
export function entryMark(entry: MatchEntry): { label: string, kind: DefaultMarkKind | null } | null {
  const thrust = (action: string) => (action === 'thrust' ? ' (thrust)' : '')
  switch (entry.kind) {
    case 'clean':
      return { label: `${SIDE_NAMES[entry.side]} hit: ${entry.target}${thrust(entry.action)}`, kind: 'hit' }
    case 'afterblow':
      return { label: `${SIDE_NAMES[entry.side]} hit: ${entry.target}${thrust(entry.action)}, afterblow: ${entry.afterblow.target}`, kind: 'afterblow' }
    case 'double':
      return { label: `Double: red ${entry.a.target}, blue ${entry.b.target}`, kind: 'double' }
    case 'void':
      return { label: entry.reason === 'not-seen' ? 'Not seen' : 'No valid hit', kind: null }
    case 'card':
      return { label: `${SIDE_NAMES[entry.side]} card: ${entry.colour}`, kind: null }
    case 'ring-out':
      return { label: `${SIDE_NAMES[entry.side]} ring-out`, kind: null }
    case 'time-up':
      return { label: 'Time up', kind: null }
    case 'concede':
      return { label: `${SIDE_NAMES[entry.side]} concedes`, kind: null }
    case 'cancel':
      return null
  }
}

export interface SyncMark {
  entryId: string
  matchId: number
  /** The counted bout or exchange this entry was, if any. */
  bout: number | null
  /** Milliseconds from the recording's start, with the offset applied. */
  atMs: number
  label: string
  kind: DefaultMarkKind | null
}

export interface ClipWindow { startMs: number, endMs: number }

/** A match fenced in a recording's ring, with its marks in the recording and the suggested clips. */
export interface RingMatch {
  id: number
  tournamentName: string
  label: string
  red: string | null
  blue: string | null
  marks: SyncMark[]
  windows: { match: ClipWindow, bouts: (ClipWindow & { bout: number })[] } | null
}

/** Before a match's first entry: the salute, the call and the first exchange. Our own figure. */
export const MATCH_LEAD_MS = 15_000
/** After an entry: the halt and the director's call. Our own figure. */
export const ENTRY_TAIL_MS = 4_000

const clamp = (ms: number, durationMs: number) => Math.max(0, Math.min(durationMs, Math.round(ms)))

/**
 * The suggested clip of a whole match (from a little before its first mark to a little after its
 * last) and of each counted bout (from the end of the one before, or the match's start, to a
 * little after its own mark). Marks must be of one match, in time order.
 */
export function suggestWindows(marks: readonly SyncMark[], durationMs: number): { match: ClipWindow, bouts: (ClipWindow & { bout: number })[] } | null {
  if (marks.length === 0) return null
  const first = marks[0]!.atMs
  const last = marks[marks.length - 1]!.atMs
  const match = { startMs: clamp(first - MATCH_LEAD_MS, durationMs), endMs: clamp(last + ENTRY_TAIL_MS, durationMs) }
  const bouts: (ClipWindow & { bout: number })[] = []
  let from = match.startMs
  for (const mark of marks) {
    if (mark.bout === null || bouts.some(b => b.bout === mark.bout)) continue
    const window = { bout: mark.bout, startMs: clamp(from, durationMs), endMs: clamp(mark.atMs + ENTRY_TAIL_MS, durationMs) }
    if (window.endMs > window.startMs) bouts.push(window)
    from = mark.atMs + 1000
  }
  return match.endMs > match.startMs ? { match, bouts } : null
}

/** "1:02:03.040" or "2:03.040": a position in a recording for people. */
export function formatPosition(ms: number): string {
  const sign = ms < 0 ? '−' : ''
  const total = Math.abs(Math.round(ms))
  const h = Math.floor(total / 3_600_000)
  const m = Math.floor(total / 60_000) % 60
  const s = Math.floor(total / 1000) % 60
  const rest = String(total % 1000).padStart(3, '0')
  const mm = h > 0 ? String(m).padStart(2, '0') : String(m)
  return `${sign}${h > 0 ? `${h}:` : ''}${mm}:${String(s).padStart(2, '0')}.${rest}`
}

export const CLIP_MODES = ['auto', 'copy', 'exact'] as const
export type ClipMode = typeof CLIP_MODES[number]

/**
 * How a clip is cut. `copy` keeps the recording's own frames and starts at the keyframe at or
 * before the start asked for (fast, no loss); `exact` re-encodes from the very frame; `auto`
 * copies when that keyframe is within `toleranceMs` of the start, else cuts exactly.
 */
export function chooseCut(mode: ClipMode, startMs: number, keyframeMs: number | null, toleranceMs: number): { mode: 'copy' | 'exact', startMs: number } {
  if (mode === 'exact' || keyframeMs === null) return { mode: 'exact', startMs }
  if (mode === 'copy' || startMs - keyframeMs <= toleranceMs) return { mode: 'copy', startMs: keyframeMs }
  return { mode: 'exact', startMs }
}
