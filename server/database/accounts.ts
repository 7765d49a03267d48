// People, clubs, roles and sign-in.
import { relations, sql } from 'drizzle-orm'
import { index, integer, pgTable, primaryKey, serial, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core'
import { timestamps } from './columns'

export const users = pgTable('users', {
  id: serial('id').primaryKey(),
  email: text('email').notNull(),
  name: text('name').notNull(),
  passwordHash: text('password_hash').notNull(),
  ...timestamps,
}, t => [uniqueIndex('users_email_unique').on(sql`lower(${t.email})`)])

export const clubs = pgTable('clubs', {
  id: serial('id').primaryKey(),
  slug: text('slug').notNull(),
  name: text('name').notNull(),
  town: text('town').notNull().default(''),
  about: text('about').notNull().default(''),
  primaryColor: text('primary_color').notNull().default('#2b313b'),
  secondaryColor: text('secondary_color').notNull().default('#c3902c'),
  logoKey: text('logo_key'),
  ...timestamps,
}, t => [uniqueIndex('clubs_slug_unique').on(t.slug)])

// Roles are data: a member holds any subset of ROLES (shared/utils/roles.ts).
export const memberships = pgTable('memberships', {
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  userId: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  roles: text('roles').array().notNull().default(sql`'{}'::text[]`),
  ...timestamps,
}, t => [
  primaryKey({ columns: [t.clubId, t.userId] }),
  index('memberships_user_idx').on(t.userId),
])

// Tokens are stored only as SHA-256 hashes; the plain token exists only in the e-mail.
export const invitations = pgTable('invitations', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  email: text('email').notNull(),
  roles: text('roles').array().notNull(),
  tokenHash: text('token_hash').notNull(),
  invitedBy: integer('invited_by').references(() => users.id, { onDelete: 'set null' }),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  acceptedAt: timestamp('accepted_at', { withTimezone: true }),
  revokedAt: timestamp('revoked_at', { withTimezone: true }),
  ...timestamps,
}, t => [
  uniqueIndex('invitations_token_unique').on(t.tokenHash),
  index('invitations_club_idx').on(t.clubId),
])

export const passwordResets = pgTable('password_resets', {
  id: serial('id').primaryKey(),
  userId: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  tokenHash: text('token_hash').notNull(),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  usedAt: timestamp('used_at', { withTimezone: true }),
  ...timestamps,
}, t => [uniqueIndex('password_resets_token_unique').on(t.tokenHash)])

// One row per failed sign-in; kept in PostgreSQL so that every app process sees the same count.
export const signInFailures = pgTable('sign_in_failures', {
  id: serial('id').primaryKey(),
  email: text('email').notNull(),
  ip: text('ip').notNull(),
  failedAt: timestamp('failed_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  index('sign_in_failures_email_idx').on(t.email, t.failedAt),
  index('sign_in_failures_ip_idx').on(t.ip, t.failedAt),
])

export const usersRelations = relations(users, ({ many }) => ({ memberships: many(memberships) }))
export const clubsRelations = relations(clubs, ({ many }) => ({ memberships: many(memberships), invitations: many(invitations) }))
export const membershipsRelations = relations(memberships, ({ one }) => ({
  club: one(clubs, { fields: [memberships.clubId], references: [clubs.id] }),
  user: one(users, { fields: [memberships.userId], references: [users.id] }),
}))
export const invitationsRelations = relations(invitations, ({ one }) => ({
  club: one(clubs, { fields: [invitations.clubId], references: [clubs.id] }),
}))
export * from './matches'
