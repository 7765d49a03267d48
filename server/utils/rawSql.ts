import type pg from 'pg'
import { getTableColumns } from 'drizzle-orm'
import type { DbTx } from './events'

// Plain prepared statements for the few queries the ring desk and the live bus wait on. Drizzle's
// query builder costs about a millisecond a query in building and mapping, and PostgreSQL plans an
// unnamed statement every time; a named statement is parsed and planned once per connection.
// The statements still run on the caller's Drizzle transaction, through its pg client.

export interface RawQuery {
  /** Names a prepared statement: one text per name, always. */
  name: string
  text: string
  values: unknown[]
}

/** The pg client under a Drizzle database or transaction (drizzle-orm 0.45: `session.client`; the pool for the database itself). */
export function pgClientOf(db: DbTx): pg.ClientBase | pg.Pool {
  const client = (db as unknown as { session?: { client?: pg.ClientBase | pg.Pool } }).session?.client
  if (!client || typeof client.query !== 'function') throw new Error('rawSql: no pg client under this Drizzle object')
  return client
}

export async function rawQuery<T extends pg.QueryResultRow>(db: DbTx, query: RawQuery): Promise<T[]> {
  const result = await pgClientOf(db).query<T>({ name: query.name, text: query.text, values: query.values })
  return result.rows
}

/**
 * `"alias"."snake_name" as "camelKey", …` for every column of a table, so that a raw row has the
 * same shape as Drizzle's `$inferSelect` (pg turns timestamps into Dates and jsonb into objects).
 */
export function columnsOf(table: Parameters<typeof getTableColumns>[0], alias: string, prefix = ''): string {
  return Object.entries(getTableColumns(table)).map(([key, column]) => `"${alias}"."${column.name}" as "${prefix}${key}"`).join(', ')
}

/** The fields of a row that were selected with a prefix, without it. */
export function unprefix<T>(row: Record<string, unknown>, prefix: string): T {
  const out: Record<string, unknown> = {}
  for (const key in row) if (key.startsWith(prefix)) out[key.slice(prefix.length)] = row[key]
  return out as T
}
