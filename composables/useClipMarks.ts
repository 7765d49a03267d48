import type { MaybeRefOrGetter } from 'vue'
import type { MarkClipView, MarkKindView, MarkView } from '#shared/footage/marks'

export type ClipMark = Omit<MarkView, 'entryId'> & { entryId?: string | null }
export type ClipDetails = MarkClipView
export type MarkKind = MarkKindView

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
