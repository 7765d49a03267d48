import { and, eq } from 'drizzle-orm'
import { Marked } from 'marked'
import { cardAltText } from '#shared/cards/text'
import type { Embed } from '#shared/utils/embeds'
import { splitBody } from '#shared/utils/embeds'
import type { DbTx } from './events'

// A breakdown's body as HTML for the club site, the editor's preview and the feeds: markdown by
// marked, embeds from live data at the time of reading (a pool's table as it stands), then all of
// it through the sanitiser.

type Club = typeof schema.clubs.$inferSelect

const marked = new Marked({ gfm: true, breaks: false, async: false })

/** Text made safe inside HTML or XML, in elements and in quoted attributes. */
export const escapeMarkup = (text: string) => text.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)

const NOTICES: Record<Embed['kind'], string> = {
  clip: 'This clip is not available.',
  pool: 'This pool table is not available.',
  match: 'This match is not available.',
  card: 'This result card is not available.',
}

const notice = (text: string) => `<p class="embed embed-notice" role="note">${escapeMarkup(text)}</p>`

const percent = (rate: number | null) => (rate === null ? '–' : `${Math.round(rate * 100)}%`)

async function clipHtml(tx: DbTx, club: Club, clipId: number) {
  const c = schema.clips
  const r = schema.recordings
  const [clip] = await tx.select({ id: c.id, title: c.title }).from(c)
    .innerJoin(r, eq(r.id, c.recordingId)).innerJoin(schema.events, eq(schema.events.id, r.eventId))
    .where(and(eq(c.id, clipId), eq(c.clubId, club.id), eq(c.status, 'ready'), eq(schema.events.published, true)))
  if (!clip) return null
  const title = escapeMarkup(clip.title)
  return `<figure class="embed embed-clip"><iframe src="${appLink(`/embed/clips/${clip.id}`)}" title="Clip: ${title}" width="640" height="360" loading="lazy" allowfullscreen></iframe><figcaption>${title}</figcaption></figure>`
}

async function poolHtml(tx: DbTx, club: Club, tournamentId: number, poolNumber: number) {
  const t = schema.tournaments
  const [row] = await tx.select({ tournament: t }).from(t)
    .innerJoin(schema.events, eq(schema.events.id, t.eventId))
    .where(and(eq(t.id, tournamentId), eq(schema.events.clubId, club.id), eq(schema.events.published, true)))
  if (!row || row.tournament.phase === 'entries') return null
  const loaded = await loadPools(tx, tournamentId)
  if (!loaded.some(p => p.pool.number === poolNumber)) return null
  const tables = await tournamentTables(tx, row.tournament, loaded)
  const table = tables.pools.find(p => p.number === poolNumber)
  if (!table) return null
  const head = ['Rank', 'Fighter', 'Club', 'Won', 'Lost', 'Unharmed bouts', 'Survival rate', 'Scored', 'Received', 'Doubles']
  const rows = table.rows.map(x => `<tr><td>${x.rank}</td><th scope="row">${escapeMarkup(x.fighter.name)}</th><td>${escapeMarkup(x.fighter.clubName)}</td>`
    + `<td>${x.wins}</td><td>${x.losses}</td><td>${x.unharmed}</td><td>${percent(x.survivalRate)}</td><td>${x.scored}</td><td>${x.received}</td><td>${x.doubles}</td></tr>`)
  const caption = `${escapeMarkup(row.tournament.name)}, pool ${poolNumber}${table.complete ? '' : ' (still being fenced)'}`
  // A wide table scrolls sideways inside its box: the box takes focus so keyboards can scroll it.
  return `<div class="embed embed-pool" role="region" tabindex="0" aria-label="${caption}"><table><caption>${caption}</caption><thead><tr>${head.map(h => `<th scope="col">${h}</th>`).join('')}</tr></thead><tbody>${rows.join('')}</tbody></table></div>`
}

const RESULT_WORDS = { 'draw': 'Draw', 'both-lose': 'Both lost' } as const

async function matchHtml(tx: DbTx, club: Club, matchId: number) {
  const { view } = await findPublicMatch(tx, club.slug, matchId)
  const side = (s: 'a' | 'b') => `${escapeMarkup(view[s].name)} (${escapeMarkup(view[s].clubName)})`
  const result = view.result === null
    ? (view.status === 'scheduled' ? 'Still to be fenced' : 'Under way')
    : view.result === 'a' || view.result === 'b' ? `${escapeMarkup(view[view.result].name)} won` : RESULT_WORDS[view.result]
  return `<div class="embed embed-match"><p class="embed-score"><a href="${appLink(`/site/${club.slug}/matches/${matchId}`)}">${side('a')} ${view.score.a} – ${view.score.b} ${side('b')}</a></p>`
    + `<p class="embed-meta">${escapeMarkup(view.stage)} · ${result}</p></div>`
}

async function cardHtml(tx: DbTx, club: Club, subject: PublicCardSubject, id: string) {
  const { data } = await publicCardData(tx, club.slug, subject, id)
  const alt = cardAltText(cardInput(data, 'link', { clubName: club.name, primary: club.primaryColor, secondary: club.secondaryColor, logo: null }))
  return `<figure class="embed embed-card"><img src="${appLink(publicCardPath(club.slug, subject, id))}" alt="${escapeMarkup(alt)}" width="1200" height="630" loading="lazy"></figure>`
}

async function embedHtml(tx: DbTx, club: Club, embed: Embed): Promise<string | null> {
  switch (embed.kind) {
    case 'clip': return clipHtml(tx, club, embed.clipId)
    case 'pool': return poolHtml(tx, club, embed.tournamentId, embed.poolNumber)
    case 'match': return matchHtml(tx, club, embed.matchId)
    case 'card': return cardHtml(tx, club, embed.subject, embed.id)
  }
}

const isNotFound = (err: unknown) => [400, 404, 409].includes((err as { statusCode?: number }).statusCode ?? 0)

/** The body as safe HTML. An embed that is unknown, mistyped or not public becomes a short notice. */
export async function renderPostBody(club: Club, body: string): Promise<string> {
  const parts = splitBody(body)
  const html = await useDb().transaction(async (tx) => {
    const out: string[] = []
    for (const part of parts) {
      if (part.type === 'markdown') {
        out.push(marked.parse(part.text) as string)
        continue
      }
      if (!part.embed) {
        out.push(notice(`Not an embed we know: ${part.source}`))
        continue
      }
      try {
        out.push(await embedHtml(tx, club, part.embed) ?? notice(NOTICES[part.embed.kind]))
      }
      catch (err) {
        if (!isNotFound(err)) throw err
        out.push(notice(NOTICES[part.embed.kind]))
      }
    }
    return out.join('\n')
  })
  return sanitizePostHtml(html)
}
