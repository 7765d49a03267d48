import { sql } from 'drizzle-orm'
import { check, index, integer, pgTable, serial, text, timestamp } from 'drizzle-orm/pg-core'
import { CARD_BATCH_STATUSES } from '../../shared/cards/types'
import type { CardBatchStatus, CardSize } from '../../shared/cards/types'
import { clubs, users } from './accounts'
import { tournaments } from './tournaments'

/**
 * An export of every card of a tournament as one ZIP, made by a background job. The job moves
 * `done` on as it goes, so the studio can show the progress; the cards themselves are stored by
 * their hash, so a batch reuses every card made before.
 */
export const cardBatches = pgTable('card_batches', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  tournamentId: integer('tournament_id').notNull().references(() => tournaments.id, { onDelete: 'cascade' }),
  sizes: text('sizes').array().$type<CardSize[]>().notNull(),
  status: text('status').$type<CardBatchStatus>().notNull().default('queued'),
  total: integer('total').notNull().default(0),
  done: integer('done').notNull().default(0),
  // Cards found in the store rather than drawn again.
  reused: integer('reused').notNull().default(0),
  zipKey: text('zip_key'),
  zipBytes: integer('zip_bytes'),
  error: text('error'),
  // The process that took the job (host and pid), for operators.
  worker: text('worker'),
  requestedBy: integer('requested_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  startedAt: timestamp('started_at', { withTimezone: true }),
  finishedAt: timestamp('finished_at', { withTimezone: true }),
}, t => [
  index('card_batches_club_idx').on(t.clubId, t.createdAt),
  check('card_batches_status', sql`${t.status} in (${sql.raw(CARD_BATCH_STATUSES.map(s => `'${s}'`).join(', '))})`),
  check('card_batches_progress', sql`${t.done} >= 0 and ${t.done} <= ${t.total} and ${t.reused} <= ${t.done}`),
  check('card_batches_done_has_zip', sql`${t.status} <> 'done' or ${t.zipKey} is not null`),
])
