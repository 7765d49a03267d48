import type { MaybeRefOrGetter } from 'vue'

export interface ClipMark {
  id: number
  atMs: number
  kindId: number | null
  kind: string | null
  label: string
  comment: string
  entryId?: string | null
}

export interface ClipDetails {
  id: number
  title: string
  status: string
  durationMs: number
  frameRate: number
  hasVideo: boolean
  hasPoster: boolean
  isPublic: boolean
}

export interface MarkKind {
  id: number
  name: string
  usedBy: number
}

export function clipMediaUrl(clubId: number, clipId: number, file: 'video' | 'poster' | 'marks.vtt') {
  return `/media/clubs/${clubId}/clips/${clipId}/${file}`
}

export function publicClipMediaUrl(clipId: number, file: 'video' | 'poster' | 'marks.vtt') {
  return `/media/public/clips/${clipId}/${file}`
}

export function useClipMarks(clubId: MaybeRefOrGetter<number>, clipId: MaybeRefOrGetter<number>) {
  return useFetch<{ clip: ClipDetails, marks: ClipMark[] }>(() => `/api/clubs/${toValue(clubId)}/clips/${toValue(clipId)}/marks`, {
    key: () => `clip-marks-${toValue(clubId)}-${toValue(clipId)}`,
  })
}

export function useMarkKinds(clubId: MaybeRefOrGetter<number>) {
  return useFetch<{ kinds: MarkKind[] }>(() => `/api/clubs/${toValue(clubId)}/mark-kinds`, {
    key: () => `mark-kinds-${toValue(clubId)}`,
  })
}

export function usePublicClip(clipId: MaybeRefOrGetter<number>) {
  return useFetch<{ clip: ClipDetails, marks: ClipMark[] }>(() => `/api/public/clips/${toValue(clipId)}`, {
    key: () => `public-clip-${toValue(clipId)}`,
  })
}
