import { sql } from 'drizzle-orm'
import { bigint, check, doublePrecision, index, integer, pgTable, serial, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { clubs, users } from './accounts'
import { timestamps } from './columns'
import { matches } from './matches'
import { events } from './tournaments'

/**
 * A recording of one ring, uploaded straight to object storage in parts. `startsAt` is when the
 * recording began (read from the file or entered); `offsetMs` is the commentator's correction
 * found at one sync point, added to every time the desk recorded for this ring.
 */
export const recordings = pgTable('recordings', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  eventId: integer('event_id').notNull().references(() => events.id, { onDelete: 'cascade' }),
  ringNumber: integer('ring_number').notNull(),
  title: text('title').notNull(),
  fileName: text('file_name').notNull(),
  contentType: text('content_type').notNull(),
  bytes: bigint('bytes', { mode: 'number' }).notNull(),
  // Random, never derived from the file name: object keys cannot be guessed.
  objectKey: text('object_key').notNull(),
  // The multipart upload while it is open; null once it is complete.
  uploadId: text('upload_id'),
  partSize: integer('part_size').notNull(),
  status: text('status').$type<'uploading' | 'probing' | 'ready' | 'failed'>().notNull().default('uploading'),
  error: text('error'),
  durationMs: integer('duration_ms'),
  frameRate: doublePrecision('frame_rate'),
  width: integer('width'),
  height: integer('height'),
  startsAt: timestamp('starts_at', { withTimezone: true }),
  startSource: text('start_source').$type<'file' | 'entered'>(),
  offsetMs: integer('offset_ms').notNull().default(0),
  uploadedBy: integer('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  uniqueIndex('recordings_object_key_unique').on(t.objectKey),
  index('recordings_event_ring_idx').on(t.eventId, t.ringNumber),
  check('recordings_status', sql`${t.status} in ('uploading', 'probing', 'ready', 'failed')`),
  check('recordings_ring_positive', sql`${t.ringNumber} >= 1`),
])

/** A cut of a recording: a whole match or one bout, made by a background job with ffmpeg. */
export const clips = pgTable('clips', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  recordingId: integer('recording_id').notNull().references(() => recordings.id, { onDelete: 'cascade' }),
  matchId: integer('match_id').references(() => matches.id, { onDelete: 'set null' }),
  boutNumber: integer('bout_number'),
  title: text('title').notNull(),
  // The window asked for, in milliseconds from the recording's start.
  startMs: integer('start_ms').notNull(),
  endMs: integer('end_ms').notNull(),
  mode: text('mode').$type<'copy' | 'exact'>().notNull(),
  // What was asked for: `auto` copies when a keyframe is within `toleranceMs` before the start.
  requestedMode: text('requested_mode').$type<'auto' | 'copy' | 'exact'>().notNull().default('auto'),
  toleranceMs: integer('tolerance_ms').notNull().default(500),
  // Where the cut file really starts in the recording (a copy cut starts at a keyframe).
  cutStartMs: integer('cut_start_ms'),
  status: text('status').$type<'queued' | 'cutting' | 'ready' | 'failed'>().notNull().default('queued'),
  progress: integer('progress').notNull().default(0),
  objectKey: text('object_key'),
  posterKey: text('poster_key'),
  // What ffprobe reads from the cut file.
  durationMs: integer('duration_ms'),
  error: text('error'),
  createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  index('clips_recording_idx').on(t.recordingId),
  index('clips_match_idx').on(t.matchId),
  check('clips_window', sql`${t.startMs} >= 0 and ${t.endMs} > ${t.startMs}`),
  check('clips_progress', sql`${t.progress} between 0 and 100`),
  check('clips_status', sql`${t.status} in ('queued', 'cutting', 'ready', 'failed')`),
  check('clips_mode', sql`${t.mode} in ('copy', 'exact')`),
  check('clips_requested_mode', sql`${t.requestedMode} in ('auto', 'copy', 'exact')`),
  check('clips_tolerance', sql`${t.toleranceMs} >= 0`),
])

/** The club's own list of kinds of action for marks (hit, afterblow, double, parry …). */
export const markKinds = pgTable('mark_kinds', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  position: integer('position').notNull().default(0),
  ...timestamps,
}, t => [uniqueIndex('mark_kinds_club_name_unique').on(t.clubId, sql`lower(${t.name})`)])

/** A timed action on a clip with a label and one line of commentary. */
export const marks = pgTable('marks', {
  id: serial('id').primaryKey(),
  clipId: integer('clip_id').notNull().references(() => clips.id, { onDelete: 'cascade' }),
  // Milliseconds from the clip's start.
  atMs: integer('at_ms').notNull(),
  kindId: integer('kind_id').references(() => markKinds.id, { onDelete: 'restrict' }),
  label: text('label').notNull(),
  comment: text('comment').notNull().default(''),
  // The desk entry this mark was suggested from, if any.
  entryId: uuid('entry_id'),
  createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  index('marks_clip_idx').on(t.clipId, t.atMs),
  check('marks_at_positive', sql`${t.atMs} >= 0`),
])
