import { and, eq, sql } from 'drizzle-orm'
import type { Db } from './db'

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]

/**
 * Runs a change to one membership and refuses it when the club would be left without an admin.
 * The club's membership rows are locked first, so two admins demoting each other cannot both win.
 */
export async function changeMembership<T>(clubId: number, userId: number, change: (tx: Tx) => Promise<T>) {
  return useDb().transaction(async (tx) => {
    const rows = await tx.select().from(schema.memberships).where(eq(schema.memberships.clubId, clubId)).for('update')
    if (!rows.some(row => row.userId === userId)) {
      throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Member not found' })
    }
    const result = await change(tx)
    const [admins] = await tx.select({ n: sql<number>`count(*)::int` }).from(schema.memberships)
      .where(and(eq(schema.memberships.clubId, clubId), sql`'admin' = any(${schema.memberships.roles})`))
    if ((admins?.n ?? 0) === 0) {
      throw fieldError(409, 'roles', 'A club needs at least one admin. Make someone else admin first.')
    }
    return result
  })
}
