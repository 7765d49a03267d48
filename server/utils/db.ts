import os from 'node:os'
import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import * as schema from '../database/schema'

export { schema }

let client: ReturnType<typeof createClient> | undefined

function createClient() {
  const pool = new pg.Pool({ connectionString: useRuntimeConfig().databaseUrl, max: 10 })
  // An idle client that loses its server (PostgreSQL restarted) must not crash the process.
  pool.on('error', err => console.error('[db] idle client error:', err.message))
  if (process.env.UNSCATHED_ROLE === 'worker') pool.on('connect', lowerPriority)
  return drizzle(pool, { schema })
}

// A worker's database work (the rings' snapshots, later the job queue) should give way to the
// ring desks' as the worker process itself does: its server processes run at a lower priority
// where the operating system lets this process change them (same user, or root).
export const WORKER_NICENESS = 10

function lowerPriority(client: pg.PoolClient) {
  // The server process's pid comes with the connection (BackendKeyData): no query, so nothing
  // runs on the client while the pool hands it out.
  const pid = (client as pg.PoolClient & { processID?: number }).processID
  if (!pid) return
  try {
    os.setPriority(pid, WORKER_NICENESS)
  }
  catch {
    // Not allowed here: the worker's queries run at normal priority.
  }
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
