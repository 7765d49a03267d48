import { and, asc, eq, inArray, isNotNull } from 'drizzle-orm'
import { cardAltText } from '#shared/cards/text'
import type { JobRun } from '.'

// One mailing: a breakdown post to the club's confirmed readers, or each fighter's pool-summary
// card to the fighters of a tournament who gave an e-mail. Safe to run again: every message is
// claimed in mail_deliveries before it is sent, and a claimed message is never sent twice.

type Mailing = typeof schema.mailings.$inferSelect
type Club = typeof schema.clubs.$inferSelect

export async function sendMailing(data: { mailingId: number }, job: JobRun) {
  const db = useDb()
  const m = schema.mailings
  const [mailing] = await db.update(m).set({ status: 'running', startedAt: new Date(), error: null })
    .where(and(eq(m.id, data.mailingId), inArray(m.status, ['queued', 'running']))).returning()
  // Gone with its post or tournament, or finished by an earlier run.
  if (!mailing) return
  try {
    const [club] = await db.select().from(schema.clubs).where(eq(schema.clubs.id, mailing.clubId))
    if (!club) return
    const failures = mailing.kind === 'post' ? await sendPost(mailing, club) : await sendCards(mailing, club)
    if (failures > 0 && !job.lastAttempt) throw new Error(`${failures} ${failures === 1 ? 'message was' : 'messages were'} not accepted by the mail server`)
    await countProgress(mailing.id)
    await db.update(m).set({
      status: 'done',
      finishedAt: new Date(),
      ...(failures > 0 ? { error: `${failures} ${failures === 1 ? 'message' : 'messages'} could not be sent` } : {}),
    }).where(eq(m.id, mailing.id))
  }
  catch (err) {
    const message = err instanceof Error ? err.message : String(err)
    await db.update(m).set(job.lastAttempt
      ? { status: 'failed', error: `The mailing stopped: ${message}`, finishedAt: new Date() }
      : { status: 'queued', error: `Trying again after: ${message}` }).where(eq(m.id, mailing.id)).catch(() => {})
    throw err
  }
}

async function sendPost(mailing: Mailing, club: Club): Promise<number> {
  const db = useDb()
  const [post] = await db.select().from(schema.posts).where(eq(schema.posts.id, mailing.postId!))
  if (!post || post.status !== 'published') {
    await db.update(schema.mailings).set({ error: 'The post was taken back before it was sent' }).where(eq(schema.mailings.id, mailing.id))
    return 0
  }
  const s = schema.subscribers
  const readers = await db.select({ id: s.id, email: s.email, token: s.unsubscribeToken }).from(s)
    .where(and(eq(s.clubId, club.id), eq(s.status, 'confirmed'))).orderBy(asc(s.id))
  const tokens = new Map(readers.map(r => [`s${r.id}`, r.token]))
  await setTotal(mailing, readers.length)
  const link = appLink(`/site/${club.slug}/posts/${post.slug}`)
  return deliver(mailing.id, readers.map(r => ({ key: `s${r.id}`, email: r.email, subscriberId: r.id })), async (r) => {
    const unsubscribe = unsubscribeLink(club, tokens.get(r.key)!)
    return {
      to: r.email,
      subject: post.title,
      text: [
        `${club.name}: a new breakdown`,
        '',
        post.title,
        ...(post.summary ? ['', post.summary] : []),
        '',
        `Read it and watch the clips: ${link}`,
        '',
        '—',
        `You get this because you subscribed to the breakdowns of ${club.name}.`,
        `Unsubscribe: ${unsubscribe}`,
      ].join('\n'),
      html: mailHtml(post.title, [
        `<p style="text-transform: uppercase; letter-spacing: 0.1em; font-size: 0.8rem">${escapeMarkup(club.name)}: a new breakdown</p>`,
        `<h1 style="font-size: 1.5rem"><a href="${escapeMarkup(link)}">${escapeMarkup(post.title)}</a></h1>`,
        ...(post.summary ? [`<p>${escapeMarkup(post.summary)}</p>`] : []),
        `<p><a href="${escapeMarkup(link)}">Read it and watch the clips</a></p>`,
        `<hr><p style="font-size: 0.85rem">You get this because you subscribed to the breakdowns of ${escapeMarkup(club.name)}. <a href="${escapeMarkup(unsubscribe)}">Unsubscribe</a></p>`,
      ]),
      // RFC 8058: a mail client may offer one-click unsubscribing by POSTing to this address.
      headers: {
        'List-Unsubscribe': `<${unsubscribe}>`,
        'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
      },
    }
  })
}

async function sendCards(mailing: Mailing, club: Club): Promise<number> {
  const db = useDb()
  const source = await db.transaction(async tx => loadCardSource(tx, await findCardTournament(tx, club.id, mailing.tournamentId!)))
  const e = schema.entries
  const f = schema.fighters
  const people = await db.select({ entryId: e.id, fighterId: f.id, email: f.email }).from(e)
    .innerJoin(f, eq(f.id, e.fighterId))
    .where(and(eq(e.tournamentId, source.tournament.id), isNotNull(f.email))).orderBy(asc(f.id))
  // Only fighters with a pool summary to show: those who fenced in a pool.
  const inPools = new Set(source.tables?.overall.rows.map(r => r.fighter.entryId) ?? [])
  const fighters = people.filter(p => p.email && inPools.has(p.entryId))
  const entryOf = new Map(fighters.map(p => [`f${p.fighterId}`, p.entryId]))
  await setTotal(mailing, fighters.length)
  const brand = await cardBrand(club)
  return deliver(mailing.id, fighters.map(p => ({ key: `f${p.fighterId}`, email: p.email!, fighterId: p.fighterId })), async (r) => {
    const input = cardInput(fighterCard(source, entryOf.get(r.key)!), 'square', brand)
    const card = await produceCard(club.id, input, { keepPng: true })
    const alt = cardAltText(input)
    const { tournament, event } = source
    const name = input.data.kind === 'fighter' ? input.data.fighter.name : ''
    const eventLink = event.published ? appLink(`/site/${club.slug}/events/${event.slug}`) : null
    return {
      to: r.email,
      subject: `Your result card: ${tournament.name}, ${event.name}`,
      text: [
        `Hello ${name},`,
        '',
        `thank you for fencing in ${tournament.name} at ${event.name}. Your pool summary is attached as a picture (1080 × 1080) to keep or share.`,
        '',
        `What the card shows: ${alt}`,
        ...(eventLink ? ['', `All results: ${eventLink}`] : []),
        '',
        `— ${club.name}`,
      ].join('\n'),
      html: mailHtml(`Your result card: ${tournament.name}`, [
        `<p>Hello ${escapeMarkup(name)},</p>`,
        `<p>thank you for fencing in ${escapeMarkup(tournament.name)} at ${escapeMarkup(event.name)}. Your pool summary is attached as a picture (1080 × 1080) to keep or share.</p>`,
        `<p><img src="cid:result-card" alt="${escapeMarkup(alt)}" width="540" height="540"></p>`,
        `<p>What the card shows: ${escapeMarkup(alt)}</p>`,
        ...(eventLink ? [`<p><a href="${escapeMarkup(eventLink)}">All results</a></p>`] : []),
        `<p>— ${escapeMarkup(club.name)}</p>`,
      ]),
      attachments: [{ filename: 'result-card.png', content: card.png!, contentType: 'image/png', cid: 'result-card' }],
    }
  })
}

async function setTotal(mailing: Mailing, total: number) {
  await useDb().update(schema.mailings).set({ total }).where(eq(schema.mailings.id, mailing.id))
}
