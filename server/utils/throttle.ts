import type { H3Event } from 'h3'
import { and, count, eq, gt, lt } from 'drizzle-orm'

// Failures within the window that lock sign-in for the rest of it. An account is locked
// sooner than an address, because many people may share a club's address.
export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000
export const MAX_FAILURES_PER_ACCOUNT = 5
export const MAX_FAILURES_PER_ADDRESS = 20

export function clientAddress(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: useRuntimeConfig().trustProxy === 'true' }) ?? 'unknown'
}

export async function assertSignInAllowed(event: H3Event, email: string) {
  const ip = clientAddress(event)
  const db = useDb()
  const since = new Date(Date.now() - SIGN_IN_WINDOW_MS)
  const t = schema.signInFailures
  const [byAccount] = await db.select({ n: count() }).from(t).where(and(eq(t.email, email), gt(t.failedAt, since)))
  const [byAddress] = await db.select({ n: count() }).from(t).where(and(eq(t.ip, ip), gt(t.failedAt, since)))
  if ((byAccount?.n ?? 0) >= MAX_FAILURES_PER_ACCOUNT || (byAddress?.n ?? 0) >= MAX_FAILURES_PER_ADDRESS) {
    throw tooManyRequests(event, SIGN_IN_WINDOW_MS, `Too many failed sign-ins. Try again in ${Math.round(SIGN_IN_WINDOW_MS / 60000)} minutes, or reset your password.`)
  }
}

/** A 429 that says when to come back (Retry-After, in seconds), with the fields it concerns if any. */
export function tooManyRequests(event: H3Event, windowMs: number, message: string, fields?: Record<string, string>) {
  setResponseHeader(event, 'retry-after', windowMs / 1000)
  return createError({ statusCode: 429, statusMessage: 'Too Many Requests', message, ...(fields ? { data: { fields } } : {}) })
}

export async function recordSignInFailure(email: string, ip: string) {
  const db = useDb()
  await db.insert(schema.signInFailures).values({ email, ip })
  // Old rows are of no further use; pruning here keeps the table small without a cron job.
  await db.delete(schema.signInFailures).where(lt(schema.signInFailures.failedAt, new Date(Date.now() - SIGN_IN_WINDOW_MS)))
}

export async function clearSignInFailures(email: string) {
  await useDb().delete(schema.signInFailures).where(eq(schema.signInFailures.email, email))
}
