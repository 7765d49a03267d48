import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import * as schema from '../database/schema'

export { schema }

let client: ReturnType<typeof createClient> | undefined

function createClient() {
  const pool = new pg.Pool({ connectionString: useRuntimeConfig().databaseUrl, max: 10 })
  // An idle client that loses its server (PostgreSQL restarted) must not crash the process.
  pool.on('error', err => console.error('[db] idle client error:', err.message))
  return drizzle(pool, { schema })
}

/** The one Drizzle client of this process. */
export function useDb() {
  client ??= createClient()
  return client
}

export type Db = ReturnType<typeof useDb>

/** True for PostgreSQL's unique_violation, also when Drizzle wraps the driver's error. */
export function isUniqueViolation(err: unknown): boolean {
  const codeOf = (e: unknown) => (typeof e === 'object' && e !== null && 'code' in e ? (e as { code: unknown }).code : undefined)
  return codeOf(err) === '23505' || (typeof err === 'object' && err !== null && 'cause' in err && codeOf((err as { cause: unknown }).cause) === '23505')
}
