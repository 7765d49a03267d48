import { relations, sql } from 'drizzle-orm'
import {
  check, index, integer, jsonb, pgEnum, pgTable, primaryKey, serial, text, timestamp, unique, uniqueIndex,
} from 'drizzle-orm/pg-core'
import type { MatchEntry, Side } from '../../shared/rules'
import type { Bracket } from '../../shared/tournament'
import { bracketFormat, entries, tournaments } from './tournaments'
import { users } from './accounts'

export const MATCH_STAGES = ['pool', 'final'] as const
export const MATCH_STATUSES = ['scheduled', 'under-way', 'finished', 'forfeit'] as const

export const matchStage = pgEnum('match_stage', MATCH_STAGES)
export const matchStatus = pgEnum('match_status', MATCH_STATUSES)

export const pools = pgTable('pools', {
  id: serial('id').primaryKey(),
  tournamentId: integer('tournament_id').notNull().references(() => tournaments.id, { onDelete: 'cascade' }),
  number: integer('number').notNull(),
  ringNumber: integer('ring_number').notNull().default(1),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  uniqueIndex('pools_tournament_number_unique').on(t.tournamentId, t.number),
  check('pools_number_positive', sql`${t.number} >= 1`),
  check('pools_ring_range', sql`${t.ringNumber} between 1 and 8`),
])

export const poolMembers = pgTable('pool_members', {
  poolId: integer('pool_id').notNull().references(() => pools.id, { onDelete: 'cascade' }),
  entryId: integer('entry_id').notNull().references(() => entries.id, { onDelete: 'cascade' }),
  // 1-based; the bout order tables name fighters by position.
  position: integer('position').notNull(),
}, t => [
  primaryKey({ columns: [t.poolId, t.entryId] }),
  unique('pool_members_position_unique').on(t.poolId, t.position),
  // An entry belongs to one tournament, so this also keeps it in one pool.
  uniqueIndex('pool_members_entry_unique').on(t.entryId),
  check('pool_members_position_positive', sql`${t.position} >= 1`),
])

// A match holds no score: the score is always derived from its entries by the rule engine.
export const matches = pgTable('matches', {
  id: serial('id').primaryKey(),
  tournamentId: integer('tournament_id').notNull().references(() => tournaments.id, { onDelete: 'cascade' }),
  poolId: integer('pool_id').references(() => pools.id, { onDelete: 'cascade' }),
  stage: matchStage('stage').notNull(),
  bracketMatchKey: text('bracket_match_key'),
  orderInPool: integer('order_in_pool'),
  // Null for a bracket slot whose fighter is not known yet.
  sideAEntry: integer('side_a_entry').references(() => entries.id, { onDelete: 'cascade' }),
  sideBEntry: integer('side_b_entry').references(() => entries.id, { onDelete: 'cascade' }),
  status: matchStatus('status').notNull().default('scheduled'),
  // Bumped by every append to the log, so that a desk writing from a stale view is refused.
  version: integer('version').notNull().default(0),
  forfeitedBy: text('forfeited_by').$type<Side>(),
  forfeitReason: text('forfeit_reason'),
  startedAt: timestamp('started_at', { withTimezone: true }),
  finishedAt: timestamp('finished_at', { withTimezone: true }),
  // The match clock (points format), kept by the server: time run so far, and since when it runs.
  clockElapsedMs: integer('clock_elapsed_ms').notNull().default(0),
  clockRunningSince: timestamp('clock_running_since', { withTimezone: true }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  check('matches_clock_positive', sql`${t.clockElapsedMs} >= 0`),
  index('matches_tournament_idx').on(t.tournamentId, t.stage),
  uniqueIndex('matches_pool_order_unique').on(t.poolId, t.orderInPool),
  uniqueIndex('matches_bracket_key_unique').on(t.tournamentId, t.bracketMatchKey),
  check('matches_stage_shape', sql`(${t.stage} = 'pool' and ${t.poolId} is not null and ${t.orderInPool} is not null and ${t.bracketMatchKey} is null)
    or (${t.stage} = 'final' and ${t.poolId} is null and ${t.bracketMatchKey} is not null)`),
  check('matches_version_positive', sql`${t.version} >= 0`),
  check('matches_forfeit_side', sql`(${t.status} = 'forfeit') = (${t.forfeitedBy} is not null)`),
  check('matches_forfeited_by_side', sql`${t.forfeitedBy} is null or ${t.forfeitedBy} in ('a', 'b')`),
  check('matches_two_fighters', sql`${t.sideAEntry} is null or ${t.sideBEntry} is null or ${t.sideAEntry} <> ${t.sideBEntry}`),
])

// Append-only: rows are never updated or deleted; a mistake is taken back by a `cancel` entry.
export const matchEntries = pgTable('match_entries', {
  // Made by the ring desk, so that a resent entry is recognised and stored once.
  id: text('id').notNull(),
  matchId: integer('match_id').notNull().references(() => matches.id, { onDelete: 'cascade' }),
  seq: integer('seq').notNull(),
  payload: jsonb('payload').$type<MatchEntry>().notNull(),
  recordedBy: integer('recorded_by').references(() => users.id, { onDelete: 'set null' }),
  recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  primaryKey({ columns: [t.matchId, t.id] }),
  unique('match_entries_seq_unique').on(t.matchId, t.seq),
  check('match_entries_seq_positive', sql`${t.seq} >= 1`),
])

/**
 * Every drawn lot, so that it can be shown and checked: the pool draw (scope `draw`) and the lots
 * of the tables (`pool:<pool id>`, `overall`). One seed per scope; the same seed and the same
 * fighters always give the same order.
 */
export const tournamentLots = pgTable('tournament_lots', {
  id: serial('id').primaryKey(),
  tournamentId: integer('tournament_id').notNull().references(() => tournaments.id, { onDelete: 'cascade' }),
  scope: text('scope').notNull(),
  seed: text('seed').notNull(),
  // The fighters the lot separated, sorted and joined: one draw per group of fighters.
  fighters: text('fighters').notNull(),
  order: jsonb('order').$type<string[]>().notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  uniqueIndex('tournament_lots_draw_unique').on(t.tournamentId, t.scope, t.fighters),
])

// The finals of a tournament: the finalists by their pool ranking, and for a bracket its state.
export const brackets = pgTable('brackets', {
  tournamentId: integer('tournament_id').primaryKey().references(() => tournaments.id, { onDelete: 'cascade' }),
  format: bracketFormat('format').notNull().default('bracket'),
  state: jsonb('state').$type<Bracket>(),
  // Entry ids, best first.
  field: jsonb('field').$type<number[]>().notNull().default([]),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow().$onUpdate(() => new Date()),
}, t => [
  check('brackets_state_of_format', sql`(${t.format} = 'bracket') = (${t.state} is not null)`),
])

export const poolsRelations = relations(pools, ({ one, many }) => ({
  tournament: one(tournaments, { fields: [pools.tournamentId], references: [tournaments.id] }),
  members: many(poolMembers),
  matches: many(matches),
}))
export const poolMembersRelations = relations(poolMembers, ({ one }) => ({
  pool: one(pools, { fields: [poolMembers.poolId], references: [pools.id] }),
  entry: one(entries, { fields: [poolMembers.entryId], references: [entries.id] }),
}))
export const matchesRelations = relations(matches, ({ one, many }) => ({
  tournament: one(tournaments, { fields: [matches.tournamentId], references: [tournaments.id] }),
  pool: one(pools, { fields: [matches.poolId], references: [pools.id] }),
  entries: many(matchEntries),
}))
export const matchEntriesRelations = relations(matchEntries, ({ one }) => ({
  match: one(matches, { fields: [matchEntries.matchId], references: [matches.id] }),
}))
