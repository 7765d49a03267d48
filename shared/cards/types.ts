// Result cards: the sizes the platforms want, the kinds of card, and the data each kind is drawn
// from. The data is built on the server from the tables and finals the app already computes; the
// templates and the alt text only read it.

export const CARD_SIZES = {
  square: { width: 1080, height: 1080, label: 'Square', use: 'feed posts' },
  portrait: { width: 1080, height: 1350, label: 'Portrait', use: 'tall feed posts' },
  story: { width: 1080, height: 1920, label: 'Story', use: 'stories and reels' },
  link: { width: 1200, height: 630, label: 'Link preview', use: 'shared links (Open Graph)' },
} as const

export const CARD_SIZE_NAMES = ['square', 'portrait', 'story', 'link'] as const
export type CardSize = typeof CARD_SIZE_NAMES[number]

export const CARD_KINDS = ['match', 'fighter', 'pool', 'podium', 'summary'] as const
export type CardKind = typeof CARD_KINDS[number]

export const CARD_KIND_LABELS: Record<CardKind, string> = {
  match: 'Match result',
  fighter: 'Fighter’s pool summary',
  pool: 'Pool table',
  podium: 'Final four / podium',
  summary: 'Tournament summary',
}

/** What a card is about; the tournament itself has two kinds of card. */
export const CARD_SUBJECTS = ['match', 'fighter', 'pool', 'tournament'] as const
export type CardSubject = typeof CARD_SUBJECTS[number]

export const KINDS_BY_SUBJECT: Record<CardSubject, readonly CardKind[]> = {
  match: ['match'],
  fighter: ['fighter'],
  pool: ['pool'],
  tournament: ['podium', 'summary'],
}

export const SUBJECT_OF_KIND: Record<CardKind, CardSubject> = {
  match: 'match',
  fighter: 'fighter',
  pool: 'pool',
  podium: 'tournament',
  summary: 'tournament',
}

export const HEADLINE_MAX = 80
export const CAPTION_MAX = 160
export const ALT_MAX = 1000

/** Where the card comes from, for its header and its alt text. */
export interface CardContext {
  clubName: string
  eventName: string
  /** Empty for a card about a whole event. */
  tournamentName: string
  /** e.g. "10 October 2026" or "10–11 October 2026". */
  dates: string
}

export interface CardFighter {
  name: string
  clubName: string
}

/** One counted bout (first-hit) or exchange (points) of a match, for the bout strip. */
export interface CardBout {
  number: number
  kind: 'clean' | 'afterblow' | 'double' | 'other'
  points: { a: number, b: number }
  hit: { a: boolean, b: boolean }
}

export interface MatchCardData {
  kind: 'match'
  context: CardContext
  /** e.g. "Pool 2, match 7", "Semifinal", "Final". */
  stage: string
  format: 'first-hit' | 'points'
  a: CardFighter
  b: CardFighter
  score: { a: number, b: number }
  status: 'scheduled' | 'under-way' | 'finished' | 'forfeit'
  /** The side that won, a draw, both lost (double-out), or null while not decided. */
  result: 'a' | 'b' | 'draw' | 'both-lose' | null
  /** The side that forfeited, for a forfeit. */
  forfeitedBy: 'a' | 'b' | null
  bouts: CardBout[]
}

export type CardQualification = 'qualified' | 'in contention' | 'out' | 'withdrawn' | 'expelled'

export interface FighterCardData {
  kind: 'fighter'
  context: CardContext
  fighter: CardFighter
  pool: { number: number, rank: number, size: number, complete: boolean } | null
  overall: { rank: number, of: number, complete: boolean }
  record: { wins: number, losses: number, draws: number }
  bouts: number
  unharmed: number
  /** unharmed ÷ bouts; null before the first bout. */
  survivalRate: number | null
  qualification: CardQualification
  /** How many reach the finals. */
  topN: number
}

export interface PoolCardRow {
  rank: number
  name: string
  clubName: string
  wins: number
  losses: number
  draws: number
  bouts: number
  unharmed: number
  survivalRate: number | null
  indicator: number
  /** Withdrawn or expelled: shown, but struck from the ranking. */
  out: boolean
}

export interface PoolCardData {
  kind: 'pool'
  context: CardContext
  number: number
  complete: boolean
  rows: PoolCardRow[]
}

export interface PodiumPlace {
  /** 1–4; two fighters share third without a bronze match. */
  place: number
  fighter: CardFighter
  /** For the final four before the finals end: their rank from the pools. */
  seed: number | null
}

export interface PodiumCardData {
  kind: 'podium'
  context: CardContext
  /** True: the places of the finished finals; false: the finalists as they go in. */
  complete: boolean
  places: PodiumPlace[]
}

export interface SummaryCardData {
  kind: 'summary'
  context: CardContext
  fighters: number
  clubs: number
  matches: number
  bouts: number
  doubles: number
  /** doubles ÷ bouts; null before the first bout. */
  doublesRate: number | null
  /** The winner once the finals are over. */
  winner: CardFighter | null
}

export type CardData = MatchCardData | FighterCardData | PoolCardData | PodiumCardData | SummaryCardData

/** The club's look on a card: the two brand colours and the logo, when there is one. */
export interface CardBrand {
  clubName: string
  primary: string
  secondary: string
  /** A data: URL of the logo (PNG, JPEG or WebP). */
  logo: string | null
}

/** Everything a card is drawn from: nothing else reaches the template. */
export interface CardInput {
  data: CardData
  size: CardSize
  headline: string
  caption: string
  brand: CardBrand
}

export const CARD_BATCH_STATUSES = ['queued', 'running', 'done', 'failed'] as const
export type CardBatchStatus = typeof CARD_BATCH_STATUSES[number]
