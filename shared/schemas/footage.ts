import { z } from 'zod'
import { CLIP_MODES, MAX_PARTS, MAX_RECORDING_BYTES, VIDEO_CONTENT_TYPE } from '../footage'

const id = (what: string) => z.number({ error: `Choose ${what}` }).int({ error: `Choose ${what}` }).positive({ error: `Choose ${what}` }).max(2147483647)
const text = (what: string, max: number) => z.string({ error: `Enter ${what}` }).transform(s => s.replace(/\s+/g, ' ').trim())
  .pipe(z.string().min(1, { error: `Enter ${what}` }).max(max, { error: `Use at most ${max} characters` }))
const ms = (what: string) => z.number({ error: `Give ${what} in milliseconds` }).int({ error: `Give ${what} in whole milliseconds` })

/** A new recording, before its bytes are sent. */
export const recordingCreateSchema = z.object({
  eventId: id('an event'),
  ring: z.number({ error: 'Choose a ring' }).int({ error: 'Choose a ring' }).min(1, { error: 'Choose a ring' }).max(8, { error: 'Choose a ring' }),
  title: text('a title', 120),
  fileName: text('the file name', 255),
  contentType: z.string({ error: 'Give the file type' }).regex(VIDEO_CONTENT_TYPE, { error: 'Choose a video file (its type must start with video/)' }),
  bytes: z.number({ error: 'Give the file size' }).int({ error: 'Give the file size in bytes' }).positive({ error: 'The file is empty' })
    .max(MAX_RECORDING_BYTES, { error: `The file is larger than ${MAX_RECORDING_BYTES / 1024 ** 3} GB` }),
}).strict()

const partNumber = z.number({ error: 'Give a part number' }).int({ error: 'Give a part number' }).min(1, { error: 'Parts are numbered from 1' }).max(MAX_PARTS)

export const partUrlsSchema = z.object({
  partNumbers: z.array(partNumber, { error: 'List the part numbers' }).min(1, { error: 'Ask for at least one part' }).max(100, { error: 'Ask for at most 100 parts at a time' }),
}).strict()

export const completeUploadSchema = z.object({
  parts: z.array(z.object({
    partNumber,
    etag: z.string({ error: 'Give the part\'s ETag' }).min(1, { error: 'Give the part\'s ETag' }).max(200),
  }).strict(), { error: 'List the uploaded parts' }).min(1, { error: 'List the uploaded parts' }).max(MAX_PARTS),
}).strict()

/** What the commentator changes on a recording: its title, its start, the sync offset. */
export const recordingPatchSchema = z.object({
  title: text('a title', 120).optional(),
  startsAt: z.iso.datetime({ offset: true, error: 'Use a date and time like 2026-09-12T09:30:00Z' }).optional(),
  // A day either way is far more than any clock can be wrong by.
  offsetMs: ms('the offset').min(-86_400_000, { error: 'The offset is more than a day' }).max(86_400_000, { error: 'The offset is more than a day' }).optional(),
}).strict().refine(v => Object.keys(v).length > 0, { error: 'Change at least one of title, startsAt, offsetMs' })

/** The longest clip: a whole match with its pauses. Our own figure. */
export const MAX_CLIP_MS = 30 * 60_000

export const clipRequestSchema = z.object({
  startMs: ms('the start').min(0, { error: 'The start cannot be before the recording' }),
  endMs: ms('the end').positive({ error: 'The end must be after the recording\'s start' }),
  title: text('a title', 160).optional(),
  matchId: id('a match').optional(),
  boutNumber: z.number({ error: 'Give the bout number' }).int().min(1, { error: 'Bouts are numbered from 1' }).max(1000).optional(),
  mode: z.enum(CLIP_MODES, { error: `Choose how to cut: ${CLIP_MODES.join(', ')}` }).default('auto'),
  // How far before the start a keyframe may be for a copy cut in `auto` mode.
  toleranceMs: ms('the tolerance').min(0, { error: 'The tolerance cannot be negative' }).max(10_000, { error: 'Use a tolerance of at most 10 s' }).default(500),
}).strict().superRefine((v, ctx) => {
  if (v.endMs <= v.startMs) ctx.addIssue({ code: 'custom', path: ['endMs'], message: 'The end must be after the start' })
  else if (v.endMs - v.startMs > MAX_CLIP_MS) ctx.addIssue({ code: 'custom', path: ['endMs'], message: 'A clip is at most 30 minutes long' })
  if (v.boutNumber !== undefined && v.matchId === undefined) ctx.addIssue({ code: 'custom', path: ['matchId'], message: 'Choose the match of the bout' })
})
