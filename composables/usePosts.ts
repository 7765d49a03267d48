import type { PostStatus } from '#shared/schemas/posts'

// Breakdown posts in the club area (server/api/clubs/[clubId]/posts).

export interface PostListItem {
  id: number
  slug: string
  title: string
  summary: string
  status: PostStatus
  stage: PostStatus | 'live' | 'scheduled'
  publishAt: string | null
  publishedAt: string | null
  authorId: number | null
  authorName: string | null
  version: number
  updatedAt: string
}

export interface PostDetail extends Omit<PostListItem, 'authorName'> {
  body: string
  eventId: number | null
  authorName: string | null
  createdAt: string
}

export interface PostRevision { number: number, title: string, summary: string, body: string, createdAt: string, authorName: string | null }

export interface PostEmbedOptions {
  events: { id: number, slug: string, name: string, published: boolean }[]
  clips: { id: number, title: string, status: string, eventName: string, published: boolean }[]
  pools: { tournamentId: number, tournamentName: string, number: number, eventName: string, published: boolean }[]
  matches: { id: number, stage: string, status: string, tournamentName: string, eventName: string, published: boolean, a: string, b: string }[]
}

export const POST_STAGE_LABELS: Record<PostListItem['stage'], string> = {
  draft: 'Draft',
  review: 'In review',
  published: 'Published',
  live: 'Published',
  scheduled: 'Scheduled',
}

const WHEN = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' })
export const postWhen = (iso: string) => WHEN.format(new Date(iso))
