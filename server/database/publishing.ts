import { sql } from 'drizzle-orm'
import { check, index, integer, pgTable, serial, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core'
import { clubs, users } from './accounts'
import { timestamps } from './columns'
import { events, fighters, tournaments } from './tournaments'

/**
 * A breakdown post: markdown with our own embeds, written by a commentator and published by an
 * editor or admin, now or at `publishAt`. A post is public once `status` is published and
 * `publishedAt` has passed. `announcedAt` is set once its e-mail to subscribers has been queued.
 */
export const posts = pgTable('posts', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  eventId: integer('event_id').references(() => events.id, { onDelete: 'set null' }),
  slug: text('slug').notNull(),
  title: text('title').notNull(),
  summary: text('summary').notNull().default(''),
  body: text('body').notNull().default(''),
  status: text('status').$type<'draft' | 'review' | 'published'>().notNull().default('draft'),
  publishAt: timestamp('publish_at', { withTimezone: true }),
  publishedAt: timestamp('published_at', { withTimezone: true }),
  announcedAt: timestamp('announced_at', { withTimezone: true }),
  authorId: integer('author_id').references(() => users.id, { onDelete: 'set null' }),
  publishedBy: integer('published_by').references(() => users.id, { onDelete: 'set null' }),
  // Bumped by every save: an editor's save on an older version gets a conflict.
  version: integer('version').notNull().default(1),
  ...timestamps,
}, t => [
  uniqueIndex('posts_club_slug_unique').on(t.clubId, t.slug),
  index('posts_club_published_idx').on(t.clubId, t.publishedAt),
  check('posts_status', sql`${t.status} in ('draft', 'review', 'published')`),
])

/** Every saved version of a post, kept for the history and for restoring. */
export const postRevisions = pgTable('post_revisions', {
  id: serial('id').primaryKey(),
  postId: integer('post_id').notNull().references(() => posts.id, { onDelete: 'cascade' }),
  number: integer('number').notNull(),
  title: text('title').notNull(),
  summary: text('summary').notNull(),
  body: text('body').notNull(),
  authorId: integer('author_id').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [uniqueIndex('post_revisions_number_unique').on(t.postId, t.number)])

/** A reader of the club site who asked for its breakdowns by e-mail (double opt-in). */
export const subscribers = pgTable('subscribers', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  email: text('email').notNull(),
  status: text('status').$type<'pending' | 'confirmed' | 'unsubscribed'>().notNull().default('pending'),
  // SHA-256 of the confirmation token mailed to the reader.
  confirmTokenHash: text('confirm_token_hash'),
  confirmSentAt: timestamp('confirm_sent_at', { withTimezone: true }),
  // Random; the unsubscribe link and the List-Unsubscribe header carry it.
  unsubscribeToken: text('unsubscribe_token').notNull(),
  confirmedAt: timestamp('confirmed_at', { withTimezone: true }),
  unsubscribedAt: timestamp('unsubscribed_at', { withTimezone: true }),
  ...timestamps,
}, t => [
  uniqueIndex('subscribers_club_email_unique').on(t.clubId, sql`lower(${t.email})`),
  uniqueIndex('subscribers_unsubscribe_token_unique').on(t.unsubscribeToken),
  check('subscribers_status', sql`${t.status} in ('pending', 'confirmed', 'unsubscribed')`),
])

/**
 * One sending of mail to many people, made by a background job: a breakdown post to the club's
 * confirmed readers (one per post), or the fighters' result cards (one per tournament). The job
 * moves `sent` on as it goes, so the readers page can show the progress.
 */
export const mailings = pgTable('mailings', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  kind: text('kind').$type<'post' | 'cards'>().notNull(),
  postId: integer('post_id').references(() => posts.id, { onDelete: 'cascade' }),
  tournamentId: integer('tournament_id').references(() => tournaments.id, { onDelete: 'cascade' }),
  subject: text('subject').notNull(),
  status: text('status').$type<'queued' | 'running' | 'done' | 'failed'>().notNull().default('queued'),
  total: integer('total').notNull().default(0),
  sent: integer('sent').notNull().default(0),
  failed: integer('failed').notNull().default(0),
  error: text('error'),
  // The queue's job, once it took one: a mailing without is queued again by the next announcement round.
  jobId: text('job_id'),
  requestedBy: integer('requested_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  startedAt: timestamp('started_at', { withTimezone: true }),
  finishedAt: timestamp('finished_at', { withTimezone: true }),
}, t => [
  index('mailings_club_idx').on(t.clubId, t.createdAt),
  uniqueIndex('mailings_post_unique').on(t.postId),
  uniqueIndex('mailings_tournament_unique').on(t.tournamentId),
  check('mailings_kind', sql`(${t.kind} = 'post' and ${t.postId} is not null) or (${t.kind} = 'cards' and ${t.tournamentId} is not null)`),
  check('mailings_status', sql`${t.status} in ('queued', 'running', 'done', 'failed')`),
])

/**
 * One message of a mailing to one person. The row is claimed before the message is sent, and a
 * claimed row is never sent again: a job run twice, or retried after a crash, sends each once.
 */
export const mailDeliveries = pgTable('mail_deliveries', {
  id: serial('id').primaryKey(),
  mailingId: integer('mailing_id').notNull().references(() => mailings.id, { onDelete: 'cascade' }),
  subscriberId: integer('subscriber_id').references(() => subscribers.id, { onDelete: 'set null' }),
  fighterId: integer('fighter_id').references(() => fighters.id, { onDelete: 'set null' }),
  // `s<subscriber id>` or `f<fighter id>`: unique within the mailing, and kept when the row it names is removed.
  recipient: text('recipient').notNull(),
  email: text('email').notNull(),
  status: text('status').$type<'sending' | 'sent' | 'failed'>().notNull().default('sending'),
  error: text('error'),
  claimedAt: timestamp('claimed_at', { withTimezone: true }).notNull().defaultNow(),
  sentAt: timestamp('sent_at', { withTimezone: true }),
}, t => [
  uniqueIndex('mail_deliveries_recipient_unique').on(t.mailingId, t.recipient),
  check('mail_deliveries_status', sql`${t.status} in ('sending', 'sent', 'failed')`),
])

/** Subscription requests, per address and club, for throttling (rows older than an hour are pruned). */
export const subscribeRequests = pgTable('subscribe_requests', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  ip: text('ip').notNull(),
  requestedAt: timestamp('requested_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [index('subscribe_requests_ip_idx').on(t.ip, t.requestedAt)])
