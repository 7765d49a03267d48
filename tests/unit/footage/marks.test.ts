import { describe, expect, it } from 'vitest'
import { clampMs, currentMark, formatClipTime, frameRateOf, markSpans, markText, MARK_HOLD_MS, spokenClipTime, stepFrames } from '#shared/footage/marks'

const mark = (id: number, atMs: number, label = `m${id}`, comment = '') => ({ id, atMs, label, comment })

describe('clip times', () => {
  it('formats minutes, seconds and hundredths', () => {
    expect(formatClipTime(0)).toBe('0:00.00')
    expect(formatClipTime(7_400)).toBe('0:07.40')
    expect(formatClipTime(63_005)).toBe('1:03.01')
    expect(formatClipTime(-20)).toBe('0:00.00')
  })

  it('says the time in words for screen readers', () => {
    expect(spokenClipTime(7_400)).toBe('7.4 seconds')
    expect(spokenClipTime(1_000)).toBe('1 second')
    expect(spokenClipTime(63_000)).toBe('1 minute 3 seconds')
  })

  it('keeps a time inside the clip', () => {
    expect(clampMs(-5, 6000)).toBe(0)
    expect(clampMs(7000, 6000)).toBe(6000)
    expect(clampMs(1234.6, 6000)).toBe(1235)
  })
})

describe('frame steps', () => {
  it('moves one frame of 40 ms at 25 fps and lands on frame boundaries', () => {
    expect(stepFrames(1000, 1, 25, 6000)).toBe(1040)
    expect(stepFrames(1000, -1, 25, 6000)).toBe(960)
    // Between frames 25 and 26: snaps to the nearest frame, then steps.
    expect(stepFrames(1013, 1, 25, 6000)).toBe(1040)
  })

  it('returns to the same frame after n steps forward and n back at 29.97 fps', () => {
    let ms = 2000
    for (let i = 0; i < 7; i++) ms = stepFrames(ms, 1, 30000 / 1001, 60_000)
    for (let i = 0; i < 7; i++) ms = stepFrames(ms, -1, 30000 / 1001, 60_000)
    expect(ms).toBe(stepFrames(2000, 0, 30000 / 1001, 60_000))
  })

  it('stops at the clip’s start and end', () => {
    expect(stepFrames(0, -1, 25, 6000)).toBe(0)
    expect(stepFrames(6000, 1, 25, 6000)).toBe(6000)
  })

  it('uses 25 fps when the recording has no usable frame rate', () => {
    expect(frameRateOf(null)).toBe(25)
    expect(frameRateOf(Number.NaN)).toBe(25)
    expect(frameRateOf(0)).toBe(25)
    expect(frameRateOf(50)).toBe(50)
  })
})

describe('which mark shows when', () => {
  it('shows a mark until the next later one, or for a few seconds after the last', () => {
    const spans = markSpans([mark(2, 5000), mark(1, 1000), mark(3, 1500)])
    expect(spans.map(s => [s.mark.id, s.startMs, s.endMs])).toEqual([[1, 1000, 1500], [3, 1500, 5000], [2, 5000, 5000 + MARK_HOLD_MS]])
  })

  it('does not hold a mark longer than the hold time when the next one is far away', () => {
    expect(markSpans([mark(1, 0), mark(2, 20_000)])[0]!.endMs).toBe(MARK_HOLD_MS)
  })

  it('gives marks at the same time the same span, and the later-made one wins the overlay', () => {
    const marks = [mark(1, 1000), mark(2, 1000), mark(3, 3000)]
    expect(markSpans(marks).map(s => s.endMs)).toEqual([3000, 3000, 3000 + MARK_HOLD_MS])
    expect(currentMark(marks, 1200)?.id).toBe(2)
  })

  it('finds the mark on screen at a time, and none before the first or after the hold', () => {
    const marks = [mark(1, 1000), mark(2, 2000)]
    expect(currentMark(marks, 999)).toBeNull()
    expect(currentMark(marks, 1000)?.id).toBe(1)
    expect(currentMark(marks, 1999)?.id).toBe(1)
    expect(currentMark(marks, 2000)?.id).toBe(2)
    expect(currentMark(marks, 2000 + MARK_HOLD_MS)).toBeNull()
  })

  it('writes "label — comment", or the label alone', () => {
    expect(markText({ label: 'Hit', comment: ' clean thrust ' })).toBe('Hit — clean thrust')
    expect(markText({ label: 'Parry', comment: '' })).toBe('Parry')
  })
})
