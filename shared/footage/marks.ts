// Marks on a clip: the pure parts shared by the clip editor, the public player and the server.

/** The kinds a club starts with when it has written none of its own. */
export const DEFAULT_MARK_KINDS = ['hit', 'afterblow', 'double', 'parry', 'feint', 'footwork'] as const

/** Used when a recording's frame rate is not known (ffprobe did not give one). */
export const DEFAULT_FRAME_RATE = 25

export const MARK_LABEL_MAX = 80
export const MARK_COMMENT_MAX = 280
export const MARK_KIND_NAME_MAX = 40
export const MARK_KINDS_MAX = 40

/** How long a mark's text stays up when no later mark ends it. */
export const MARK_HOLD_MS = 4000

/** A mark as the API answers it. */
export interface MarkView {
  id: number
  atMs: number
  kindId: number | null
  kind: string | null
  label: string
  comment: string
  entryId: string | null
}

/** A clip as marking and the player need it. */
export interface MarkClipView {
  id: number
  title: string
  status: string
  durationMs: number
  frameRate: number
  hasVideo: boolean
  hasPoster: boolean
  // Anyone may watch it (the public player): cut, and its event published.
  isPublic: boolean
}

export interface MarkKindView {
  id: number
  name: string
  usedBy: number
}

export interface TimedMark {
  id: number
  atMs: number
  label: string
  comment: string
}

/** A usable frame rate: the recording's when it is a sane number, else the default. */
export function frameRateOf(rate: number | null | undefined): number {
  return typeof rate === 'number' && Number.isFinite(rate) && rate >= 1 && rate <= 240 ? rate : DEFAULT_FRAME_RATE
}

/**
 * The time one frame away from `ms` at `fps`, in whole milliseconds, kept inside [0, durationMs].
 * Lands on frame boundaries, so stepping n frames forward and n back returns to the same frame.
 */
export function stepFrames(ms: number, frames: number, fps: number, durationMs: number): number {
  const rate = frameRateOf(fps)
  const frame = Math.round((ms * rate) / 1000) + frames
  return clampMs(Math.round((frame * 1000) / rate), durationMs)
}

export function clampMs(ms: number, durationMs: number): number {
  return Math.min(Math.max(0, Math.round(ms)), Math.max(0, durationMs))
}

/** "0:07.40" for the editor and the player: minutes, seconds and hundredths. */
export function formatClipTime(ms: number): string {
  const total = Math.max(0, Math.round(ms / 10))
  const hundredths = total % 100
  const seconds = Math.floor(total / 100) % 60
  const minutes = Math.floor(total / 6000)
  return `${minutes}:${String(seconds).padStart(2, '0')}.${String(hundredths).padStart(2, '0')}`
}

/** "7.4 seconds" / "1 minute 3 seconds": the same time for screen readers. */
export function spokenClipTime(ms: number): string {
  const seconds = Math.max(0, ms) / 1000
  const minutes = Math.floor(seconds / 60)
  const rest = Math.round((seconds - minutes * 60) * 10) / 10
  const secondsText = `${rest} second${rest === 1 ? '' : 's'}`
  return minutes > 0 ? `${minutes} minute${minutes === 1 ? '' : 's'} ${secondsText}` : secondsText
}

/** Marks in time order; marks at the same time keep the order they were made in (by id). */
export function sortMarks<M extends TimedMark>(marks: readonly M[]): M[] {
  return [...marks].sort((a, b) => a.atMs - b.atMs || a.id - b.id)
}

/** When each mark's text stops showing: at the next later mark, or MARK_HOLD_MS after it. */
export function markSpans<M extends TimedMark>(marks: readonly M[], holdMs = MARK_HOLD_MS): { mark: M, startMs: number, endMs: number }[] {
  const sorted = sortMarks(marks)
  return sorted.map((mark) => {
    const next = sorted.find(other => other.atMs > mark.atMs)
    return { mark, startMs: mark.atMs, endMs: next ? Math.min(next.atMs, mark.atMs + holdMs) : mark.atMs + holdMs }
  })
}

/** The mark whose text shows at `ms` (the latest one that has started and not ended), or null. */
export function currentMark<M extends TimedMark>(marks: readonly M[], ms: number, holdMs = MARK_HOLD_MS): M | null {
  let found: M | null = null
  for (const span of markSpans(marks, holdMs)) {
    if (span.startMs <= ms && ms < span.endMs) found = span.mark
  }
  return found
}

/** The one line a mark shows: "label — comment", or the label alone. */
export function markText(mark: Pick<TimedMark, 'label' | 'comment'>): string {
  const comment = mark.comment.trim()
  return comment ? `${mark.label} — ${comment}` : mark.label
}
