// A clip's marks as a WebVTT text track. Source: W3C WebVTT (https://www.w3.org/TR/webvtt1/),
// §4.1 (file structure: "WEBVTT" header, blank line, cues), §4.2.1 (timestamps hh:mm:ss.ttt),
// §4.2.2 (cue text: "&" and "<" must be escaped, ">" may be; "-->" must not appear in a cue or its id).
import type { TimedMark } from './marks'
import { markSpans, markText } from './marks'

/** "00:01:02.345": the long form, valid for any length (hours are at least two digits). */
export function formatVttTime(ms: number): string {
  const whole = Math.max(0, Math.round(ms))
  const millis = whole % 1000
  const seconds = Math.floor(whole / 1000) % 60
  const minutes = Math.floor(whole / 60_000) % 60
  const hours = Math.floor(whole / 3_600_000)
  const two = (n: number) => String(n).padStart(2, '0')
  return `${two(hours)}:${two(minutes)}:${two(seconds)}.${String(millis).padStart(3, '0')}`
}

/** Cue text: one line, with the three characters WebVTT gives a meaning to written as references. */
export function escapeVttText(text: string): string {
  return oneLine(text).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')
}

function oneLine(text: string): string {
  return text.replace(/[\r\n\u2028\u2029]+/g, ' ').trim()
}

/**
 * The track: one cue per mark with the id "mark-<id>", from the mark to the next later one (or a
 * few seconds after the last), its text "label — comment". Empty text would end the cue early, so
 * a mark without words keeps a dash.
 */
export function marksToVtt(marks: readonly TimedMark[], options: { title?: string, holdMs?: number } = {}): string {
  const lines = ['WEBVTT' + (options.title ? ` - ${oneLine(options.title).replace(/-->/g, '→')}` : ''), '']
  for (const { mark, startMs, endMs } of markSpans(marks, options.holdMs)) {
    lines.push(`mark-${mark.id}`, `${formatVttTime(startMs)} --> ${formatVttTime(endMs)}`, escapeVttText(markText(mark)) || '—', '')
  }
  return lines.join('\n')
}
