import type { CardBout, FighterCardData } from '#shared/cards/types'
import type { TournamentPhase } from '#shared/schemas/tournament'

// The club site's match and fighter pages (server/api/public/matches, server/api/public/fighters).

/** A public page's own address and its link-preview card, both absolute (ogp.me). */
export interface OpenGraphLinks { url: string, image: string }

export interface PublicSide { fighterId: number, name: string, clubName: string }

export interface PublicMatchView {
  club: PublicClub
  event: PublicEventSummary & { safety: { emergencyNumber: string, firstAidPoint: string } }
  tournament: { id: number, name: string, weapon: string }
  match: {
    id: number
    stage: string
    format: 'first-hit' | 'points'
    status: 'scheduled' | 'under-way' | 'finished' | 'forfeit'
    a: PublicSide
    b: PublicSide
    score: { a: number, b: number }
    result: 'a' | 'b' | 'draw' | 'both-lose' | null
    forfeitedBy: 'a' | 'b' | null
    bouts: CardBout[]
  }
  openGraph: OpenGraphLinks
}

export interface PublicFighterResult {
  entryId: number
  event: PublicEventSummary
  tournament: { id: number, name: string, weapon: string, phase: TournamentPhase }
  summary: FighterCardData | null
  place: number | null
  matches: {
    id: number
    stage: string
    opponent: PublicSide
    score: { own: number, other: number }
    status: PublicMatchView['match']['status']
    outcome: 'won' | 'lost' | 'drew' | 'both lost' | null
  }[]
}

export interface PublicFighterView {
  club: PublicClub
  fighter: { id: number, name: string, clubName: string }
  safety: { emergencyNumber: string, firstAidPoint: string }
  results: PublicFighterResult[]
  openGraph: OpenGraphLinks
}

/** The Open Graph tags of a public page (ogp.me): title, type, image (the 1200×630 card) and url. */
export function useOpenGraph(links: () => OpenGraphLinks | undefined, title: () => string, alt: () => string) {
  useSeoMeta({
    ogTitle: title,
    ogType: 'website',
    ogUrl: () => links()?.url,
    ogImage: () => links()?.image,
    ogImageWidth: 1200,
    ogImageHeight: 630,
    ogImageAlt: alt,
    twitterCard: 'summary_large_image',
  })
}

/**
 * The data of a club-site page about one thing (`/api/public/<kind>/<club>/<id>`, the id from the
 * route's `param`); a page that did not load ends in `publicPageError`.
 */
export async function usePublicThing<T>(kind: 'fighters' | 'matches' | 'posts', param: string, notFound: string, failed: string) {
  const route = useRoute()
  const slug = computed(() => String(route.params.slug ?? ''))
  const id = computed(() => String(route.params[param] ?? ''))
  const { data, error } = await useFetch<T>(
    () => `/api/public/${kind}/${encodeURIComponent(slug.value)}/${encodeURIComponent(id.value)}`,
    { key: () => `public-${kind}-${slug.value}-${id.value}` },
  )
  if (error.value || !data.value) publicPageError(error.value, notFound, failed)
  return { slug, view: computed(() => data.value as T) }
}

/** Ends a club-site page that did not load: 404 for what is not published (a bad id too), else the failure. */
export function publicPageError(error: unknown, notFound: string, failed: string): never {
  const status = apiStatus(error) ?? 500
  const missing = status === 404 || status === 400
  throw createError({
    status: missing ? 404 : status,
    statusText: missing ? 'Not Found' : 'Page unavailable',
    message: missing ? notFound : failed,
    fatal: true,
  })
}

/** The colours of a club's header band, as the club site uses them. */
export function useClubBand(club: () => PublicClub | undefined) {
  const HEX = /^#[0-9a-f]{6}$/i
  const primary = computed(() => (club() && HEX.test(club()!.primaryColor) ? club()!.primaryColor : '#2b313b'))
  const secondary = computed(() => (club() && HEX.test(club()!.secondaryColor) ? club()!.secondaryColor : '#c3902c'))
  return { primary, secondary, onPrimary: computed(() => textColorOn(primary.value)) }
}
