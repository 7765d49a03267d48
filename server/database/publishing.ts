import { sql } from 'drizzle-orm'
import { check, index, integer, pgTable, serial, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core'
import { clubs, users } from './accounts'
import { timestamps } from './columns'
import { events } from './tournaments'

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
