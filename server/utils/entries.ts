import { and, eq, isNull, sql } from 'drizzle-orm'
import type { EntryStatus } from '#shared/schemas/tournament'
import { fighterKey, MAX_IMPORT_ROWS, MAX_SEED, optionalEmailSchema, tidySpaces } from '#shared/schemas/tournament'
import type { CsvTable } from './csv'
import type { DbTx } from './events'

type Entry = typeof schema.entries.$inferSelect
type Fighter = typeof schema.fighters.$inferSelect

export function entryView(entry: Entry, fighter: Pick<Fighter, 'id' | 'name' | 'clubName'>) {
  return {
    id: entry.id,
    fighter: { id: fighter.id, name: fighter.name, clubName: fighter.clubName },
    seed: entry.seed,
    status: entry.status,
    checkedInAt: entry.checkedInAt,
    kitChecked: entry.kitChecked,
    weaponChecked: entry.weaponChecked,
    withdrawnAt: entry.withdrawnAt,
    withdrawalReason: entry.withdrawalReason,
    createdAt: entry.createdAt,
    updatedAt: entry.updatedAt,
  }
}

/** A tournament's entries: seeded ones by seed, then the rest by name. */
export async function listEntries(db: DbTx, tournamentId: number, status?: EntryStatus) {
  const n = schema.entries
  const f = schema.fighters
  const rows = await db.select({ entry: n, fighter: { id: f.id, name: f.name, clubName: f.clubName } })
    .from(n).innerJoin(f, eq(f.id, n.fighterId))
    .where(and(eq(n.tournamentId, tournamentId), status ? eq(n.status, status) : undefined))
    .orderBy(sql`${n.seed} asc nulls last`, sql`lower(${f.name})`, n.id)
  return rows.map(row => entryView(row.entry, row.fighter))
}

export async function entryWithFighter(db: DbTx, tournamentId: number, entryId: number) {
  const n = schema.entries
  const f = schema.fighters
  const [row] = await db.select({ entry: n, fighter: { id: f.id, name: f.name, clubName: f.clubName } })
    .from(n).innerJoin(f, eq(f.id, n.fighterId))
    .where(and(eq(n.id, entryId), eq(n.tournamentId, tournamentId)))
  if (!row) throw notFoundError('Entry')
  return row
}

/**
 * Locks the tournament (every entry change of one tournament takes this lock, so they never
 * interleave with each other or with the start of the pools) and finds the entry in it.
 */
export async function lockEntry(db: DbTx, ids: { clubId: number, eventId: number, tournamentId: number, entryId: number }) {
  const { tournament } = await findTournament(db, ids, { lock: true })
  const { entry, fighter } = await entryWithFighter(db, tournament.id, ids.entryId)
  return { tournament, entry, fighter }
}

export function seedTaken(seed: number, by: string) {
  return fieldError(409, 'seed', `Seed ${seed} is already given to ${by}`)
}

/** 409 on `seed` when another entry of the tournament holds it. */
export async function assertSeedFree(db: DbTx, tournamentId: number, seed: number | null, exceptEntryId?: number) {
  if (seed === null) return
  const n = schema.entries
  const [holder] = await db.select({ id: n.id, name: schema.fighters.name }).from(n)
    .innerJoin(schema.fighters, eq(schema.fighters.id, n.fighterId))
    .where(and(eq(n.tournamentId, tournamentId), eq(n.seed, seed)))
  if (holder && holder.id !== exceptEntryId) throw seedTaken(seed, holder.name)
}

// ——— CSV import ———

const IMPORT_COLUMNS = ['name', 'club', 'email', 'seed'] as const
type ImportColumn = typeof IMPORT_COLUMNS[number]
const REQUIRED_COLUMNS: readonly ImportColumn[] = ['name', 'club']

export interface ImportRowError { column: ImportColumn | 'fields', message: string, text: string }

export interface ImportRow {
  line: number
  /** The cells as read, trimmed. */
  raw: Record<ImportColumn, string>
  /** The parsed values; null where a cell is empty or not valid. */
  values: { name: string | null, club: string | null, email: string | null, seed: number | null }
  status: 'ok' | 'error'
  /** For a row without errors: a new fighter for the roster, or one already in it. */
  fighter: 'new' | 'existing' | null
  fighterId: number | null
  errors: ImportRowError[]
  notes: string[]
}

export interface ImportPlan {
  delimiter: string
  columns: ImportColumn[]
  ignoredColumns: string[]
  rows: ImportRow[]
  summary: { rows: number, ok: number, errors: number, newFighters: number, existingFighters: number }
}

function columnIndexes(header: string[]) {
  const index = new Map<ImportColumn, number>()
  const ignored: string[] = []
  header.forEach((name, i) => {
    if (!(IMPORT_COLUMNS as readonly string[]).includes(name)) {
      if (name) ignored.push(name)
      return
    }
    if (index.has(name as ImportColumn)) throw fieldError(400, 'csv', `line 1: the column "${name}" appears twice`)
    index.set(name as ImportColumn, i)
  })
  for (const column of REQUIRED_COLUMNS) {
    if (!index.has(column)) {
      throw fieldError(400, 'csv', `The file has no "${column}" column. Its first line must name the columns: name, club, and optionally email and seed (in any order).`)
    }
  }
  return { index, ignored }
}

function readRow(line: number, fields: string[], index: Map<ImportColumn, number>, width: number): ImportRow {
  const cell = (column: ImportColumn) => {
    const i = index.get(column)
    return i === undefined ? '' : (fields[i] ?? '').trim()
  }
  const raw = { name: cell('name'), club: cell('club'), email: cell('email'), seed: cell('seed') }
  const errors: ImportRowError[] = []
  const fail = (column: ImportRowError['column'], message: string) =>
    errors.push({ column, message, text: `line ${line}, ${column}: ${message}` })

  const name = tidySpaces(raw.name)
  if (!name) fail('name', 'is empty; every row needs the fighter\'s name')
  else if (name.length > 100) fail('name', 'use at most 100 characters')
  const club = tidySpaces(raw.club)
  if (!club) fail('club', 'is empty; give the fighter\'s club (or "Independent")')
  else if (club.length > 120) fail('club', 'use at most 120 characters')
  const email = optionalEmailSchema.safeParse(raw.email)
  if (!email.success) fail('email', 'is not a valid e-mail address')
  let seed: number | null = null
  if (raw.seed) {
    if (!/^\d+$/.test(raw.seed) || Number(raw.seed) < 1) fail('seed', 'must be a whole number ≥ 1')
    else if (Number(raw.seed) > MAX_SEED) fail('seed', `must be at most ${MAX_SEED}`)
    else seed = Number(raw.seed)
  }
  const extra = fields.slice(width).filter(field => field.trim() !== '')
  if (extra.length > 0) fail('fields', `has ${width + extra.length} fields but the header names ${width}; quote a field that contains the delimiter`)

  return {
    line,
    raw,
    values: {
      name: name && name.length <= 100 ? name : null,
      club: club && club.length <= 120 ? club : null,
      email: email.success ? email.data : null,
      seed,
    },
    status: errors.length ? 'error' : 'ok',
    fighter: null,
    fighterId: null,
    errors,
    notes: [],
  }
}

/**
 * Checks every row of an entries file against itself, the club's roster and the tournament's
 * entries. Writes nothing: the caller imports only a plan without errors.
 */
export async function planEntryImport(db: DbTx, clubId: number, tournamentId: number, table: CsvTable): Promise<ImportPlan> {
  const { index, ignored } = columnIndexes(table.header)
  if (table.rows.length === 0) throw fieldError(400, 'csv', 'The file has a header line but no fighters')
  if (table.rows.length > MAX_IMPORT_ROWS) throw fieldError(400, 'csv', `The file has ${table.rows.length} rows; import at most ${MAX_IMPORT_ROWS} at a time`)

  const roster = new Map<string, { id: number, email: string | null }>()
  for (const f of await db.select({ id: schema.fighters.id, name: schema.fighters.name, clubName: schema.fighters.clubName, email: schema.fighters.email })
    .from(schema.fighters).where(eq(schema.fighters.clubId, clubId))) {
    roster.set(fighterKey(f.name, f.clubName), { id: f.id, email: f.email })
  }
  const entered = await db.select({ fighterId: schema.entries.fighterId, seed: schema.entries.seed, name: schema.fighters.name })
    .from(schema.entries).innerJoin(schema.fighters, eq(schema.fighters.id, schema.entries.fighterId))
    .where(eq(schema.entries.tournamentId, tournamentId))
  const enteredIds = new Set(entered.map(e => e.fighterId))
  const seedHolders = new Map(entered.filter(e => e.seed !== null).map(e => [e.seed!, e.name]))

  const firstLineOf = new Map<string, number>()
  const seedLines = new Map<number, number>()
  const rows = table.rows.map(({ line, fields }) => {
    const row = readRow(line, fields, index, table.header.length)
    const fail = (column: ImportRowError['column'], message: string) =>
      row.errors.push({ column, message, text: `line ${line}, ${column}: ${message}` })
    const { name, club, email, seed } = row.values
    if (name && club) {
      const key = fighterKey(name, club)
      const earlier = firstLineOf.get(key)
      if (earlier !== undefined) {
        fail('name', `the same fighter as line ${earlier} (same name and club)`)
      }
      else {
        firstLineOf.set(key, line)
        const known = roster.get(key)
        if (known && enteredIds.has(known.id)) fail('name', 'is already entered in this tournament')
        if (known) {
          row.fighter = 'existing'
          row.fighterId = known.id
          if (email && known.email && email !== known.email) row.notes.push('The roster has another e-mail for this fighter; the roster keeps it')
          if (email && !known.email) row.notes.push('The e-mail will be added to the roster')
        }
        else {
          row.fighter = 'new'
        }
      }
    }
    if (seed !== null) {
      const earlier = seedLines.get(seed)
      const holder = seedHolders.get(seed)
      if (earlier !== undefined) fail('seed', `seed ${seed} is also given on line ${earlier}`)
      else if (holder !== undefined) fail('seed', `seed ${seed} is already given to ${holder}`)
      else seedLines.set(seed, line)
    }
    row.status = row.errors.length ? 'error' : 'ok'
    if (row.status === 'error') {
      row.fighter = null
      row.fighterId = null
    }
    return row
  })

  const ok = rows.filter(row => row.status === 'ok')
  return {
    delimiter: table.delimiter === '\t' ? 'tab' : table.delimiter,
    columns: IMPORT_COLUMNS.filter(column => index.has(column)),
    ignoredColumns: ignored,
    rows,
    summary: {
      rows: rows.length,
      ok: ok.length,
      errors: rows.length - ok.length,
      newFighters: ok.filter(row => row.fighter === 'new').length,
      existingFighters: ok.filter(row => row.fighter === 'existing').length,
    },
  }
}

/** Writes a plan without errors: new fighters into the roster, missing e-mails, then the entries. */
export async function applyEntryImport(tx: DbTx, clubId: number, tournamentId: number, plan: ImportPlan) {
  const fresh = plan.rows.filter(row => row.fighter === 'new')
  const created = fresh.length === 0
    ? []
    : await tx.insert(schema.fighters)
        .values(fresh.map(row => ({ clubId, name: row.values.name!, clubName: row.values.club!, email: row.values.email })))
        .returning({ id: schema.fighters.id, name: schema.fighters.name, clubName: schema.fighters.clubName })
  // Matched by name and club rather than by position: RETURNING promises no order.
  const idOf = new Map(created.map(f => [fighterKey(f.name, f.clubName), f.id]))
  for (const row of fresh) row.fighterId = idOf.get(fighterKey(row.values.name!, row.values.club!))!
  for (const row of plan.rows) {
    if (row.fighter === 'existing' && row.values.email) {
      await tx.update(schema.fighters).set({ email: row.values.email })
        .where(and(eq(schema.fighters.id, row.fighterId!), isNull(schema.fighters.email)))
    }
  }
  const entries = await tx.insert(schema.entries)
    .values(plan.rows.map(row => ({ tournamentId, fighterId: row.fighterId!, seed: row.values.seed })))
    .returning({ id: schema.entries.id })
  return { fighters: created.length, entries: entries.length }
}
