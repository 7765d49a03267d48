import { sql } from 'drizzle-orm'
import { check, index, integer, jsonb, pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core'
import { BOARD_MODES, BOARDS } from '../../shared/live/types'
import type { Board, BoardMode, LiveMessage } from '../../shared/live/types'
import { events } from './tournaments'
import { matches } from './matches'

/**
 * One row per ring of an event, made the first time the ring is used: the match its desk called,
 * the board on air, the overlay's read-only token and the position of the ring's live stream.
 */
export const ringStates = pgTable('ring_states', {
  eventId: integer('event_id').notNull().references(() => events.id, { onDelete: 'cascade' }),
  ringNumber: integer('ring_number').notNull(),
  // The last message of the ring's stream; taken with the row lock, so a ring's messages commit in order.
  seq: integer('seq').notNull().default(0),
  currentMatchId: integer('current_match_id').references(() => matches.id, { onDelete: 'set null' }),
  board: text('board').$type<Board>().notNull().default('bout'),
  boardMode: text('board_mode').$type<BoardMode>().notNull().default('auto'),
  // 244 random bits; read-only access to this ring's boards, rotated by the streamer.
  overlayToken: text('overlay_token').notNull().default(sql`replace(gen_random_uuid()::text || gen_random_uuid()::text, '-', '')`).unique('ring_states_overlay_token_unique'),
  tokenRotatedAt: timestamp('token_rotated_at', { withTimezone: true }),
  // Bumped when the desk calls a match, so that two desks calling at once do not overwrite each other.
  version: integer('version').notNull().default(0),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  primaryKey({ columns: [t.eventId, t.ringNumber] }),
  check('ring_states_ring_range', sql`${t.ringNumber} between 1 and 8`),
  check('ring_states_board', sql`${t.board} in (${sql.raw(BOARDS.map(b => `'${b}'`).join(', '))})`),
  check('ring_states_board_mode', sql`${t.boardMode} in (${sql.raw(BOARD_MODES.map(b => `'${b}'`).join(', '))})`),
])

/** Every message of every ring's stream, so that a client that reconnects resumes where it was. */
export const liveEvents = pgTable('live_events', {
  eventId: integer('event_id').notNull().references(() => events.id, { onDelete: 'cascade' }),
  ringNumber: integer('ring_number').notNull(),
  seq: integer('seq').notNull(),
  kind: text('kind').$type<LiveMessage['kind']>().notNull(),
  payload: jsonb('payload').$type<LiveMessage>().notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  primaryKey({ columns: [t.eventId, t.ringNumber, t.seq] }),
  index('live_events_kind_idx').on(t.eventId, t.ringNumber, t.kind, t.seq),
])

/** Rings whose snapshot is out of date: written with the change, cleared once a new snapshot is out. */
export const liveDirty = pgTable('live_dirty', {
  eventId: integer('event_id').notNull().references(() => events.id, { onDelete: 'cascade' }),
  ringNumber: integer('ring_number').notNull(),
  markedAt: timestamp('marked_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [primaryKey({ columns: [t.eventId, t.ringNumber] })])
