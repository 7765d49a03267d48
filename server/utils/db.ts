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
