import { and, eq } from 'drizzle-orm'
import type { CardData, CardFighter, MatchCardData } from '#shared/cards/types'
import type { DbTx } from './events'
import type { CardSource } from './cardData'

// The club site's match and fighter pages, and their link-preview cards: only what published
// events show. Anything else is not found, as if it did not exist.

type Club = typeof schema.clubs.$inferSelect
type Event = typeof schema.events.$inferSelect

export async function findPublicClub(tx: DbTx, slug: string): Promise<Club> {
  const [club] = await tx.select().from(schema.clubs).where(eq(schema.clubs.slug, slug))
  if (!club) throw notFoundError('Club')
  return club
}

export async function findPublishedEvent(tx: DbTx, club: Club, slug: string): Promise<Event> {
  const e = schema.events
  const [event] = await tx.select().from(e).where(and(eq(e.clubId, club.id), eq(e.slug, slug), eq(e.published, true)))
  if (!event) throw notFoundError('Event')
  return event
}

/** A match of a published event of the club with both fighters known, with its tournament's card source. */
export async function findPublicMatch(tx: DbTx, clubSlug: string, matchId: number) {
  const club = await findPublicClub(tx, clubSlug)
  const m = schema.matches
  const t = schema.tournaments
  const e = schema.events
  const [row] = await tx.select({ tournament: t, event: e }).from(m)
    .innerJoin(t, eq(t.id, m.tournamentId)).innerJoin(e, eq(e.id, t.eventId))
    .where(and(eq(m.id, matchId), eq(e.clubId, club.id), eq(e.published, true)))
  if (!row || row.tournament.phase === 'entries') throw notFoundError('Match')
  const source = await loadCardSource(tx, { club, event: row.event, tournament: row.tournament })
  const found = source.matches.find(x => x.row.id === matchId)
  if (!found || found.row.sideAEntry === null || found.row.sideBEntry === null) throw notFoundError('Match')
  return { club, event: row.event, source, row: found.row, view: matchView(source, found.row, found.state) }
}

export interface PublicFighterMatch {
  id: number
  stage: string
  opponent: CardFighter & { fighterId: number }
  /** The fighter's points first. */
  score: { own: number, other: number }
  status: MatchCardData['status']
  outcome: 'won' | 'lost' | 'drew' | 'both lost' | null
}

function outcomeFor(view: MatchCardData, side: 'a' | 'b'): PublicFighterMatch['outcome'] {
  if (view.result === null) return null
  if (view.result === 'draw') return 'drew'
  if (view.result === 'both-lose') return 'both lost'
  return view.result === side ? 'won' : 'lost'
}

/** A fighter of the club's roster with their results in its published events, newest event first. */
export async function findPublicFighter(tx: DbTx, clubSlug: string, fighterId: number) {
  const club = await findPublicClub(tx, clubSlug)
  const f = schema.fighters
  const [fighter] = await tx.select().from(f).where(and(eq(f.id, fighterId), eq(f.clubId, club.id)))
  if (!fighter) throw notFoundError('Fighter')
  const entries = await fighterEntries(tx, club.id, fighter.id)
  if (entries.length === 0) throw notFoundError('Fighter')
  const results = []
  for (const entry of entries) {
    const source: CardSource = await loadCardSource(tx, { club, event: entry.event, tournament: entry.tournament })
    let summary = null
    try {
      summary = fighterCard(source, entry.entryId)
    }
    catch {
      // Entered but never in a pool (withdrawn before the draw): no table to show.
    }
    const matches: PublicFighterMatch[] = source.matches
      .filter(({ row }) => row.sideAEntry === entry.entryId || row.sideBEntry === entry.entryId)
      .filter(({ row }) => row.sideAEntry !== null && row.sideBEntry !== null)
      .map(({ row, state }) => {
        const side = row.sideAEntry === entry.entryId ? 'a' : 'b'
        const other = source.refs.get(side === 'a' ? row.sideBEntry! : row.sideAEntry!)!
        const view = matchView(source, row, state)
        return {
          id: row.id,
          stage: stageOf(source, row),
          opponent: { name: other.name, clubName: other.clubName, fighterId: other.fighterId },
          score: side === 'a' ? { own: view.score.a, other: view.score.b } : { own: view.score.b, other: view.score.a },
          status: view.status,
          outcome: outcomeFor(view, side),
        }
      })
    const places = source.finals.complete ? source.finals.places : null
    const place = !places
      ? null
      : places.first === entry.entryId ? 1 : places.second === entry.entryId ? 2 : places.third.includes(entry.entryId) ? 3 : places.fourth === entry.entryId ? 4 : null
    results.push({
      entryId: entry.entryId,
      event: publicEventSummary(entry.event),
      tournament: { id: entry.tournament.id, name: entry.tournament.name, weapon: entry.tournament.weapon, phase: entry.tournament.phase },
      summary,
      place,
      matches,
    })
  }
  return { club, fighter, results, latest: entries[0]! }
}

export const PUBLIC_CARD_SUBJECTS = ['event', 'match', 'fighter'] as const
export type PublicCardSubject = typeof PUBLIC_CARD_SUBJECTS[number]

/** Where a public page's link-preview card is served. */
export function publicCardPath(clubSlug: string, subject: PublicCardSubject, id: string | number) {
  return `/cards/og/${clubSlug}/${subject}/${id}.png`
}

const PAGE_FOLDERS: Record<PublicCardSubject, string> = { event: 'events', match: 'matches', fighter: 'fighters' }

/** The page's own address and its card's, absolute, as Open Graph wants them (ogp.me). */
export function openGraphLinks(clubSlug: string, subject: PublicCardSubject, id: string | number) {
  return {
    url: appLink(`/site/${clubSlug}/${PAGE_FOLDERS[subject]}/${id}`),
    image: appLink(publicCardPath(clubSlug, subject, id)),
  }
}

const cardNumber = (id: string) => {
  if (!/^\d{1,10}$/.test(id)) throw notFoundError('Card')
  return Number(id)
}

/** The data of a public page's card: an event (by slug), a match or a fighter (by id); 404 where it is not public. */
export async function publicCardData(tx: DbTx, clubSlug: string, subject: PublicCardSubject, id: string): Promise<{ club: Club, data: CardData }> {
  if (subject === 'event') {
    const club = await findPublicClub(tx, clubSlug)
    const ev = await findPublishedEvent(tx, club, id)
    return { club, data: await eventSummaryData(tx, club, ev) }
  }
  if (subject === 'match') {
    const { club, event: ev, view, row } = await findPublicMatch(tx, clubSlug, cardNumber(id))
    // A match still to be fenced shows its event instead.
    return { club, data: hasResult(row) ? view : await eventSummaryData(tx, club, ev) }
  }
  const { club, results, latest } = await findPublicFighter(tx, clubSlug, cardNumber(id))
  const summary = results.find(r => r.summary)?.summary
  return { club, data: summary ?? await eventSummaryData(tx, club, latest.event) }
}
