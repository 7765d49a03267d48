import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import { and, count, eq, gt, lt, sql } from 'drizzle-orm'

// Readers' subscriptions with double opt-in: a request only ever mails a confirmation link, and
// only confirmed readers get breakdowns. The answer to a request is the same whether or not the
// address is known, so the form tells nobody who reads the club's mail.

type Club = typeof schema.clubs.$inferSelect
type Subscriber = typeof schema.subscribers.$inferSelect

export const SUBSCRIBE_WINDOW_MS = 15 * 60 * 1000
// Per club from one address: a family signing up several people fits; a script does not.
export const MAX_SUBSCRIBES_PER_CLUB = 10
// From one address to all clubs together.
export const MAX_SUBSCRIBES_PER_ADDRESS = 60
// A second confirmation to the same reader waits this long, so the form cannot flood an inbox.
export const CONFIRM_RESEND_MS = 60 * 1000
export const CONFIRM_TTL_MS = 7 * 24 * 3600 * 1000

export const SUBSCRIBE_ANSWER = 'Thank you. If this address can receive mail, a message with a confirmation link is on its way: open it to start getting breakdowns.'

async function assertSubscribeAllowed(event: H3Event, clubId: number) {
  const ip = clientAddress(event)
  const db = useDb()
  const r = schema.subscribeRequests
  const since = new Date(Date.now() - SUBSCRIBE_WINDOW_MS)
  const [byClub] = await db.select({ n: count() }).from(r).where(and(eq(r.ip, ip), eq(r.clubId, clubId), gt(r.requestedAt, since)))
  const [byAddress] = await db.select({ n: count() }).from(r).where(and(eq(r.ip, ip), gt(r.requestedAt, since)))
  if ((byClub?.n ?? 0) >= MAX_SUBSCRIBES_PER_CLUB || (byAddress?.n ?? 0) >= MAX_SUBSCRIBES_PER_ADDRESS) {
    throw tooManyRequests(event, SUBSCRIBE_WINDOW_MS, `email: Too many sign-ups from your network. Try again in ${Math.round(SUBSCRIBE_WINDOW_MS / 60000)} minutes.`,
      { email: 'Too many sign-ups from your network; try again later' })
  }
  await db.insert(r).values({ clubId, ip })
  await db.delete(r).where(lt(r.requestedAt, new Date(Date.now() - 4 * SUBSCRIBE_WINDOW_MS)))
}

/** The club by its slug, or 404. */
export async function findSiteClub(slug: string): Promise<Club> {
  const [club] = await useDb().select().from(schema.clubs).where(eq(schema.clubs.slug, slug))
  if (!club) throw notFoundError('Club')
  return club
}

/** Takes a reader's request and mails a confirmation link when one is due. */
export async function requestSubscription(event: H3Event, club: Club, email: string) {
  await assertSubscribeAllowed(event, club.id)
  const db = useDb()
  const s = schema.subscribers
  const { token, hash } = newToken()
  const now = new Date()
  // Only the reader can unsubscribe (the token is in their mail), so coming back is never held up.
  const due = sql`(${s.status} = 'unsubscribed' or (${s.status} = 'pending' and (${s.confirmSentAt} is null or ${s.confirmSentAt} < ${new Date(now.getTime() - CONFIRM_RESEND_MS)})))`
  const [sent] = await db.transaction(async (tx) => {
    await tx.insert(s).values({ clubId: club.id, email, unsubscribeToken: randomBytes(24).toString('base64url') }).onConflictDoNothing()
    // Pending or unsubscribed readers get a fresh link; confirmed ones nothing (they are in already).
    return tx.update(s).set({ status: 'pending', confirmTokenHash: hash, confirmSentAt: now })
      .where(and(eq(s.clubId, club.id), sql`lower(${s.email}) = ${email}`, due)).returning()
  })
  if (!sent) return
  try {
    await sendConfirmation(club, email, token)
  }
  catch (err) {
    // The reader sees the same answer; asking again after the wait sends a new link.
    console.error('[subscriptions] the confirmation was not sent:', (err as Error).message)
  }
}

async function sendConfirmation(club: Club, to: string, token: string) {
  const link = appLink(`/site/${club.slug}/subscribe/confirm?token=${token}`)
  const days = Math.round(CONFIRM_TTL_MS / 86400000)
  await sendMail({
    to,
    subject: `Confirm your subscription to ${club.name}`,
    text: [
      `Someone, probably you, asked to get the breakdowns of ${club.name} by e-mail.`,
      '',
      'To confirm, open this link:',
      link,
      '',
      `The link works for ${days} days. If you did not ask, ignore this message: nothing will be sent.`,
    ].join('\n'),
    html: mailHtml(club.name, [
      `<p>Someone, probably you, asked to get the breakdowns of ${escapeMarkup(club.name)} by e-mail.</p>`,
      `<p><a href="${escapeMarkup(link)}">Confirm my subscription</a></p>`,
      `<p>The link works for ${days} days. If you did not ask, ignore this message: nothing will be sent.</p>`,
    ]),
  })
}

/** Confirms the subscription a link names: the reader, or null when the link is unknown, expired or was withdrawn. */
export async function confirmSubscription(club: Club, token: string): Promise<Subscriber | null> {
  const s = schema.subscribers
  const hash = hashToken(token)
  const [row] = await useDb().update(s)
    .set({ status: 'confirmed', confirmedAt: sql`case when ${s.status} = 'confirmed' then ${s.confirmedAt} else now() end`, unsubscribedAt: null })
    .where(and(eq(s.clubId, club.id), eq(s.confirmTokenHash, hash), sql`${s.status} in ('pending', 'confirmed')`,
      gt(s.confirmSentAt, new Date(Date.now() - CONFIRM_TTL_MS))))
    .returning()
  return row ?? null
}

/** Unsubscribes the reader whose token this is; null when there is none. Unsubscribing twice is fine. */
export async function unsubscribe(club: Club, token: string): Promise<Subscriber | null> {
  const s = schema.subscribers
  const [row] = await useDb().update(s)
    .set({ status: 'unsubscribed', unsubscribedAt: sql`coalesce(${s.unsubscribedAt}, now())`, confirmTokenHash: null })
    .where(and(eq(s.clubId, club.id), eq(s.unsubscribeToken, token)))
    .returning()
  return row ?? null
}

export function unsubscribeLink(club: Pick<Club, 'slug'>, token: string): string {
  return appLink(`/site/${club.slug}/unsubscribe/${token}`)
}

/** A plain HTML mail around paragraphs that are already escaped. */
export function mailHtml(title: string, paragraphs: string[]): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escapeMarkup(title)}</title></head>`
    + `<body style="font-family: Georgia, serif; line-height: 1.5; color: #1d2129; max-width: 36rem">${paragraphs.join('\n')}</body></html>`
}
