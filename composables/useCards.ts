import type { BrandColourCheck } from '#shared/cards/palette'
import type { CardBatchStatus, CardKind, CardSize, CardSubject } from '#shared/cards/types'
import type { TournamentPhase } from '#shared/schemas/tournament'

// The card studio's views of the API (server/api/clubs/[clubId]/cards/…).

export interface CardStudioView {
  brand: { clubName: string, logoUrl: string | null, checks: BrandColourCheck[], notice: string | null }
  tournaments: {
    id: number
    name: string
    weapon: string
    phase: TournamentPhase
    event: { id: number, name: string, slug: string, published: boolean, startsOn: string }
  }[]
}

export interface CardSubjectView {
  subject: CardSubject
  id: number
  label: string
  kinds: CardKind[]
}

export interface CardTournamentView {
  tournament: { id: number, name: string, phase: TournamentPhase }
  event: { id: number, name: string, published: boolean }
  subjects: CardSubjectView[]
  cardsPerSize: number
  sizes: number
}

export interface CardView {
  hash: string
  url: string
  downloadUrl: string
  width: number
  height: number
  cached: boolean
  headline: string
  caption: string
  defaults: { headline: string, caption: string }
  alt: string
}

export interface CardBatchView {
  id: number
  tournamentId: number
  sizes: CardSize[]
  status: CardBatchStatus
  total: number
  done: number
  reused: number
  error: string | null
  zipBytes: number | null
  downloadUrl: string | null
  createdAt: string
  finishedAt: string | null
}

export function useCardStudio(clubId: MaybeRefOrGetter<number>) {
  return useFetch<CardStudioView>(() => `/api/clubs/${toValue(clubId)}/cards`, { key: () => `card-studio-${toValue(clubId)}` })
}

/** "84 kB", "1.2 MB". */
export function fileSize(bytes: number): string {
  return bytes < 1_000_000 ? `${Math.max(1, Math.round(bytes / 1000))} kB` : `${(bytes / 1_000_000).toFixed(1)} MB`
}
