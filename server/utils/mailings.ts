import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm'
import type { DbTx } from './events'
import type { MailMessage } from './mail'

// Mailings: a breakdown post to the club's confirmed readers, or the fighters' result cards.
// Worker processes look for newly public posts every few seconds, claim each one in a single
// statement (so two workers never announce a post twice), and queue one job per post.

type Mailing = typeof schema.mailings.$inferSelect

export function mailingView(row: Mailing) {
  return {
    id: row.id,
    kind: row.kind,
    postId: row.postId,
    tournamentId: row.tournamentId,
    subject: row.subject,
    status: row.status,
    total: row.total,
    sent: row.sent,
    failed: row.failed,
    error: row.error,
    createdAt: row.createdAt,
    finishedAt: row.finishedAt,
  }
}

/** Claims every post that became public and was not announced yet, and queues its mailing. Answers the post ids claimed. */
export async function announceNewPosts(): Promise<number[]> {
  const db = useDb()
  const claimed = await db.transaction(async (tx) => {
    const p = schema.posts
    const posts = await tx.update(p).set({ announcedAt: sql`now()` })
      .where(and(eq(p.status, 'published'), sql`${p.publishedAt} <= now()`, isNull(p.announcedAt)))
      .returning({ id: p.id, clubId: p.clubId, title: p.title })
    if (posts.length > 0) {
      await tx.insert(schema.mailings)
        .values(posts.map(post => ({ clubId: post.clubId, kind: 'post' as const, postId: post.id, subject: post.title })))
        .onConflictDoNothing()
    }
    return posts.map(post => post.id)
  })
  await queueWaitingMailings()
  return claimed
}

/** Queues every mailing that has no job yet (new ones, and any whose queueing failed before). */
export async function queueWaitingMailings() {
  const m = schema.mailings
  const waiting = await useDb().select({ id: m.id }).from(m).where(and(eq(m.status, 'queued'), isNull(m.jobId))).orderBy(asc(m.id)).limit(100)
  for (const { id } of waiting) await queueMailing(id)
}

export async function queueMailing(mailingId: number) {
  const jobId = await enqueueJob('mailing', { mailingId })
  await useDb().update(schema.mailings).set({ jobId }).where(eq(schema.mailings.id, mailingId))
}

export async function clubMailings(clubId: number, limit = 50) {
  const m = schema.mailings
  const rows = await useDb().select().from(m).where(eq(m.clubId, clubId)).orderBy(desc(m.createdAt), desc(m.id)).limit(limit)
  return rows.map(mailingView)
}

export interface Recipient {
  /** `s<subscriber id>` or `f<fighter id>`, unique within the mailing. */
  key: string
  email: string
  subscriberId?: number
  fighterId?: number
}

const BATCH = 50

/**
 * Sends `compose(recipient)` to every recipient not mailed yet, in batches. Each message's row is
 * claimed first (insert, or a failed one taken back) and a claimed row is never sent again, so a
 * second run sends nothing twice. Answers how many failed in this run.
 */
export async function deliver(mailingId: number, recipients: Recipient[], compose: (r: Recipient) => Promise<MailMessage>): Promise<number> {
  const db = useDb()
  const d = schema.mailDeliveries
  let failures = 0
  for (let start = 0; start < recipients.length; start += BATCH) {
    const batch = recipients.slice(start, start + BATCH)
    const claimed = await db.transaction(async (tx) => {
      const fresh = await tx.insert(d)
        .values(batch.map(r => ({ mailingId, recipient: r.key, email: r.email, subscriberId: r.subscriberId ?? null, fighterId: r.fighterId ?? null })))
        .onConflictDoNothing().returning({ recipient: d.recipient })
      const again = await tx.update(d).set({ status: 'sending', error: null, claimedAt: new Date() })
        .where(and(eq(d.mailingId, mailingId), eq(d.status, 'failed'), inArray(d.recipient, batch.map(r => r.key))))
        .returning({ recipient: d.recipient })
      return new Set([...fresh, ...again].map(row => row.recipient))
    })
    await Promise.all(batch.filter(r => claimed.has(r.key)).map(async (r) => {
      try {
        await sendMail(await compose(r))
        await db.update(d).set({ status: 'sent', sentAt: new Date() }).where(and(eq(d.mailingId, mailingId), eq(d.recipient, r.key)))
      }
      catch (err) {
        failures += 1
        await db.update(d).set({ status: 'failed', error: (err as Error).message.slice(0, 500) })
          .where(and(eq(d.mailingId, mailingId), eq(d.recipient, r.key)))
      }
    }))
    await countProgress(mailingId)
  }
  return failures
}

/** Writes the mailing's counts from its deliveries. */
export async function countProgress(mailingId: number) {
  const d = schema.mailDeliveries
  await useDb().update(schema.mailings).set({
    sent: sql`(select count(*) from ${d} where ${d.mailingId} = ${mailingId} and ${d.status} = 'sent')::int`,
    failed: sql`(select count(*) from ${d} where ${d.mailingId} = ${mailingId} and ${d.status} = 'failed')::int`,
  }).where(eq(schema.mailings.id, mailingId))
}

type Tournament = typeof schema.tournaments.$inferSelect

/** Every pool match fenced: the tournament is in its finals or done, or its pool tables are complete. */
export async function poolsFinished(tx: DbTx, clubId: number, tournament: Tournament): Promise<boolean> {
  if (tournament.phase === 'finals' || tournament.phase === 'done') return true
  if (tournament.phase !== 'pools') return false
  const source = await loadCardSource(tx, await findCardTournament(tx, clubId, tournament.id))
  return source.tables?.overall.complete ?? false
}

/** What the organizer's "send result cards" panel shows. */
export async function resultMailState(ids: { clubId: number, eventId: number, tournamentId: number }) {
  const db = useDb()
  return db.transaction(async (tx) => {
    const { tournament } = await findTournament(tx, ids)
    const e = schema.entries
    const f = schema.fighters
    const [withEmail] = await tx.select({ n: sql<number>`count(*)::int` }).from(e).innerJoin(f, eq(f.id, e.fighterId))
      .where(and(eq(e.tournamentId, tournament.id), sql`coalesce(${f.email}, '') <> ''`))
    const [mailing] = await tx.select().from(schema.mailings).where(eq(schema.mailings.tournamentId, tournament.id))
    return {
      ready: await poolsFinished(tx, ids.clubId, tournament),
      fightersWithEmail: withEmail?.n ?? 0,
      mailing: mailing ? mailingView(mailing) : null,
    }
  })
}
