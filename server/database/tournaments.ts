import { relations, sql } from 'drizzle-orm'
import {
  boolean, check, date, foreignKey, index, integer, jsonb, pgEnum, pgTable, serial, text, timestamp, unique, uniqueIndex,
} from 'drizzle-orm/pg-core'
import type { RuleSet } from '../../shared/rules'
import { ENTRY_STATUSES, FINALS_FORMATS, TOURNAMENT_PHASES } from '../../shared/schemas/tournament'
import { clubs, users } from './accounts'
import { timestamps } from './columns'

export const tournamentPhase = pgEnum('tournament_phase', TOURNAMENT_PHASES)
export const entryStatus = pgEnum('entry_status', ENTRY_STATUSES)
export const bracketFormat = pgEnum('bracket_format', FINALS_FORMATS)

export const ruleSets = pgTable('rule_sets', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  currentVersion: integer('current_version').notNull().default(1),
  ...timestamps,
}, t => [uniqueIndex('rule_sets_club_name_unique').on(t.clubId, sql`lower(${t.name})`)])

// Versions are never changed or removed while the rule set lives: a tournament names the one it uses.
export const ruleSetVersions = pgTable('rule_set_versions', {
  id: serial('id').primaryKey(),
  ruleSetId: integer('rule_set_id').notNull().references(() => ruleSets.id, { onDelete: 'cascade' }),
  version: integer('version').notNull(),
  settings: jsonb('settings').$type<RuleSet>().notNull(),
  createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  // A constraint rather than an index, so that tournaments can reference the pair.
  unique('rule_set_versions_version_unique').on(t.ruleSetId, t.version),
  check('rule_set_versions_version_positive', sql`${t.version} >= 1`),
])

export const events = pgTable('events', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  slug: text('slug').notNull(),
  startsOn: date('starts_on', { mode: 'string' }).notNull(),
  endsOn: date('ends_on', { mode: 'string' }).notNull(),
  venue: text('venue').notNull().default(''),
  rings: integer('rings').notNull().default(1),
  published: boolean('published').notNull().default(false),
  publishedAt: timestamp('published_at', { withTimezone: true }),
  // For the safety notice on the event's pages.
  emergencyNumber: text('emergency_number').notNull().default(''),
  firstAidPoint: text('first_aid_point').notNull().default(''),
  ...timestamps,
}, t => [
  uniqueIndex('events_club_slug_unique').on(t.clubId, t.slug),
  check('events_rings_range', sql`${t.rings} between 1 and 8`),
  check('events_dates_order', sql`${t.endsOn} >= ${t.startsOn}`),
])

export const tournaments = pgTable('tournaments', {
  id: serial('id').primaryKey(),
  eventId: integer('event_id').notNull().references(() => events.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  weapon: text('weapon').notNull(),
  ruleSetId: integer('rule_set_id').notNull(),
  ruleSetVersion: integer('rule_set_version').notNull(),
  // A copy of the chosen version's settings, taken when the pools start; rule-set edits never reach it.
  frozenRules: jsonb('frozen_rules').$type<RuleSet>(),
  phase: tournamentPhase('phase').notNull().default('entries'),
  poolSize: integer('pool_size').notNull().default(5),
  qualifyCount: integer('qualify_count').notNull().default(4),
  finalsFormat: bracketFormat('finals_format').notNull().default('bracket'),
  bronzeMatch: boolean('bronze_match').notNull().default(true),
  ...timestamps,
}, t => [
  // No action (checked at the end of the statement): a used rule set cannot be deleted, yet
  // deleting a whole club still cascades through both paths.
  foreignKey({
    name: 'tournaments_rule_set_version_fk',
    columns: [t.ruleSetId, t.ruleSetVersion],
    foreignColumns: [ruleSetVersions.ruleSetId, ruleSetVersions.version],
  }).onDelete('no action'),
  uniqueIndex('tournaments_event_name_unique').on(t.eventId, sql`lower(${t.name})`),
  index('tournaments_rule_set_idx').on(t.ruleSetId),
  check('tournaments_frozen_after_entries', sql`(${t.phase} = 'entries') = (${t.frozenRules} is null)`),
])

// The organising club's roster: everyone who has entered one of its tournaments.
export const fighters = pgTable('fighters', {
  id: serial('id').primaryKey(),
  clubId: integer('club_id').notNull().references(() => clubs.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  // The fighter's own club, as free text (it need not be on Unscathed).
  clubName: text('club_name').notNull(),
  email: text('email'),
  photoKey: text('photo_key'),
  ...timestamps,
}, t => [
  uniqueIndex('fighters_club_person_unique').on(t.clubId, sql`lower(${t.name})`, sql`lower(${t.clubName})`),
])

export const entries = pgTable('entries', {
  id: serial('id').primaryKey(),
  tournamentId: integer('tournament_id').notNull().references(() => tournaments.id, { onDelete: 'cascade' }),
  // No action: a fighter with entries stays in the roster, so results keep their names.
  fighterId: integer('fighter_id').notNull().references(() => fighters.id, { onDelete: 'no action' }),
  seed: integer('seed'),
  status: entryStatus('status').notNull().default('entered'),
  checkedInAt: timestamp('checked_in_at', { withTimezone: true }),
  checkedInBy: integer('checked_in_by').references(() => users.id, { onDelete: 'set null' }),
  // The safety checklist of the check-in: protective kit inspected, blade flex-checked and tip covered.
  kitChecked: boolean('kit_checked').notNull().default(false),
  weaponChecked: boolean('weapon_checked').notNull().default(false),
  withdrawnAt: timestamp('withdrawn_at', { withTimezone: true }),
  withdrawalReason: text('withdrawal_reason'),
  ...timestamps,
}, t => [
  uniqueIndex('entries_tournament_fighter_unique').on(t.tournamentId, t.fighterId),
  uniqueIndex('entries_tournament_seed_unique').on(t.tournamentId, t.seed),
  index('entries_fighter_idx').on(t.fighterId),
  check('entries_seed_positive', sql`${t.seed} is null or ${t.seed} >= 1`),
  // The last line of defence for the safety rule: nobody is checked in without both checks.
  check('entries_checked_in_safely', sql`${t.status} <> 'checked-in' or (${t.kitChecked} and ${t.weaponChecked} and ${t.checkedInAt} is not null)`),
  check('entries_withdrawn_has_reason', sql`${t.status} <> 'withdrawn' or (${t.withdrawnAt} is not null and ${t.withdrawalReason} is not null)`),
])

export const ruleSetsRelations = relations(ruleSets, ({ one, many }) => ({
  club: one(clubs, { fields: [ruleSets.clubId], references: [clubs.id] }),
  versions: many(ruleSetVersions),
}))
export const ruleSetVersionsRelations = relations(ruleSetVersions, ({ one }) => ({
  ruleSet: one(ruleSets, { fields: [ruleSetVersions.ruleSetId], references: [ruleSets.id] }),
}))
export const eventsRelations = relations(events, ({ one, many }) => ({
  club: one(clubs, { fields: [events.clubId], references: [clubs.id] }),
  tournaments: many(tournaments),
}))
export const tournamentsRelations = relations(tournaments, ({ one, many }) => ({
  event: one(events, { fields: [tournaments.eventId], references: [events.id] }),
  ruleSet: one(ruleSets, { fields: [tournaments.ruleSetId], references: [ruleSets.id] }),
  entries: many(entries),
}))
export const fightersRelations = relations(fighters, ({ one, many }) => ({
  club: one(clubs, { fields: [fighters.clubId], references: [clubs.id] }),
  entries: many(entries),
}))
export const entriesRelations = relations(entries, ({ one }) => ({
  tournament: one(tournaments, { fields: [entries.tournamentId], references: [tournaments.id] }),
  fighter: one(fighters, { fields: [entries.fighterId], references: [fighters.id] }),
}))
