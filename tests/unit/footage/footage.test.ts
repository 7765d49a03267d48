import { describe, expect, it } from 'vitest'
import {
  chooseCut, entryMark, formatPosition, MIN_PART_BYTES, missingParts, offsetAfterMove, partCount, partRange, partSizeFor,
  positionInRecording, suggestWindows,
} from '../../../shared/footage'
import type { SyncMark } from '../../../shared/footage'
import { clipRequestSchema, recordingCreateSchema } from '../../../shared/schemas/footage'

const MiB = 1024 * 1024

describe('multipart sizes', () => {
  it('uses S3\'s 5 MiB minimum part for small files and stays within 1000 parts for large ones', () => {
    // 5 MiB minimum and 10,000 parts at most: AWS S3 API reference, UploadPart / multipart limits.
    expect(partSizeFor(15 * MiB)).toBe(MIN_PART_BYTES)
    expect(partSizeFor(5 * MiB * 1000)).toBe(5 * MiB)
    expect(partSizeFor(5 * MiB * 1000 + 1)).toBe(6 * MiB)
    const big = 40 * 1024 * MiB
    expect(partCount(big, partSizeFor(big))).toBeLessThanOrEqual(1000)
  })

  it('splits a file into parts that cover every byte once', () => {
    const bytes = 12 * MiB + 7
    const size = partSizeFor(bytes)
    const ranges = Array.from({ length: partCount(bytes, size) }, (_, i) => partRange(i + 1, size, bytes))
    expect(ranges).toEqual([[0, 5 * MiB], [5 * MiB, 10 * MiB], [10 * MiB, bytes]])
  })

  it('lists only the parts still to send when an upload resumes', () => {
    expect(missingParts(5, [1, 2, 4])).toEqual([3, 5])
    expect(missingParts(3, [])).toEqual([1, 2, 3])
    expect(missingParts(2, [1, 2])).toEqual([])
  })
})

describe('sync', () => {
  it('puts a desk entry at its server time minus the recording\'s start, plus the offset', () => {
    const start = Date.UTC(2026, 8, 12, 9, 0, 0)
    expect(positionInRecording(start + 65_250, start, 0)).toBe(65_250)
    expect(positionInRecording(start + 65_250, start, -1_250)).toBe(64_000)
  })

  it('moves the offset by exactly how far one mark was moved', () => {
    expect(offsetAfterMove(0, 65_250, 64_000)).toBe(-1_250)
    expect(offsetAfterMove(-1_250, 64_000, 64_040)).toBe(-1_210)
  })

  const mark = (atMs: number, bout: number | null): SyncMark => ({ entryId: String(atMs), matchId: 1, bout, atMs, label: 'x', kind: 'hit' })

  it('suggests a match window from before its first mark to after its last, and one window per bout', () => {
    const windows = suggestWindows([mark(30_000, 1), mark(50_000, null), mark(60_000, 2), mark(90_000, 3)], 600_000)
    expect(windows?.match).toEqual({ startMs: 15_000, endMs: 94_000 })
    expect(windows?.bouts).toEqual([
      { bout: 1, startMs: 15_000, endMs: 34_000 },
      // A bout fenced again after "not seen" is one bout: it runs from the end of the one before.
      { bout: 2, startMs: 31_000, endMs: 64_000 },
      { bout: 3, startMs: 61_000, endMs: 94_000 },
    ])
  })

  it('keeps suggested windows inside the recording', () => {
    const windows = suggestWindows([mark(2_000, 1), mark(11_000, 2)], 12_000)
    expect(windows?.match).toEqual({ startMs: 0, endMs: 12_000 })
    expect(suggestWindows([], 12_000)).toBeNull()
  })
})

describe('mark labels', () => {
  it('names the fighter by colour, the target and the kind of action', () => {
    expect(entryMark({ kind: 'clean', id: '1', side: 'a', target: 'head', action: 'cut' })).toEqual({ label: 'Red hit: head', kind: 'hit' })
    expect(entryMark({ kind: 'afterblow', id: '2', side: 'b', target: 'arms', action: 'thrust', afterblow: { target: 'head', action: 'cut' } }))
      .toEqual({ label: 'Blue hit: arms (thrust), afterblow: head', kind: 'afterblow' })
    expect(entryMark({ kind: 'double', id: '3', a: { target: 'torso', action: 'cut' }, b: { target: 'legs', action: 'cut' } }))
      .toEqual({ label: 'Double: red torso, blue legs', kind: 'double' })
    expect(entryMark({ kind: 'void', id: '4', reason: 'not-seen' })).toEqual({ label: 'Not seen', kind: null })
    expect(entryMark({ kind: 'cancel', id: '5', targetId: '1' })).toBeNull()
  })
})

describe('cutting', () => {
  it('copies from the keyframe when it is within the tolerance, and cuts exactly otherwise', () => {
    expect(chooseCut('auto', 4_300, 4_000, 500)).toEqual({ mode: 'copy', startMs: 4_000 })
    expect(chooseCut('auto', 5_100, 4_000, 500)).toEqual({ mode: 'exact', startMs: 5_100 })
    expect(chooseCut('copy', 5_100, 4_000, 0)).toEqual({ mode: 'copy', startMs: 4_000 })
    expect(chooseCut('exact', 4_000, 4_000, 500)).toEqual({ mode: 'exact', startMs: 4_000 })
    expect(chooseCut('copy', 5_100, null, 500)).toEqual({ mode: 'exact', startMs: 5_100 })
  })

  it('writes positions as minutes, seconds and milliseconds', () => {
    expect(formatPosition(65_250)).toBe('1:05.250')
    expect(formatPosition(3_723_040)).toBe('1:02:03.040')
    expect(formatPosition(-1_250)).toBe('−0:01.250')
  })
})

describe('footage schemas', () => {
  it('takes only video files and names the field that is wrong', () => {
    const good = { eventId: 1, ring: 1, title: 'Ring 1', fileName: 'ring-1.mp4', contentType: 'video/mp4', bytes: 1000 }
    expect(recordingCreateSchema.safeParse(good).success).toBe(true)
    expect(recordingCreateSchema.safeParse({ ...good, contentType: 'application/pdf' }).error?.issues[0]?.path).toEqual(['contentType'])
    expect(recordingCreateSchema.safeParse({ ...good, bytes: 41 * 1024 ** 3 }).error?.issues[0]?.path).toEqual(['bytes'])
  })

  it('defaults a clip to auto with half a second of tolerance and refuses an end before the start', () => {
    expect(clipRequestSchema.parse({ startMs: 0, endMs: 1000 })).toMatchObject({ mode: 'auto', toleranceMs: 500 })
    expect(clipRequestSchema.safeParse({ startMs: 2000, endMs: 1000 }).error?.issues[0]?.path).toEqual(['endMs'])
  })
})
