import type { Readable } from 'node:stream'
import type { H3Event } from 'h3'
import { and, asc, count, eq, max } from 'drizzle-orm'
import { z } from 'zod'
import { GetObjectCommand } from '@aws-sdk/client-s3'
import { idParamSchema } from '#shared/schemas/club'
import { DEFAULT_MARK_KINDS, frameRateOf } from '#shared/footage/marks'
import type { MarkClipView, MarkKindView, MarkView } from '#shared/footage/marks'
import { marksToVtt } from '#shared/footage/vtt'
import type { Role } from '#shared/utils/roles'
import type { DbTx } from './events'

export const MARK_ROLES: readonly Role[] = ['commentator', 'editor']
export const MARK_KIND_ROLES: readonly Role[] = ['commentator', 'editor', 'admin']

export const markClipParams = z.object({ clubId: idParamSchema, clipId: idParamSchema })
export const markParams = markClipParams.extend({ markId: idParamSchema })
export const markKindParams = z.object({ clubId: idParamSchema, kindId: idParamSchema })

type MarkClip = MarkClipView & { clubId: number, objectKey: string | null, posterKey: string | null }

async function loadClip(db: DbTx, where: ReturnType<typeof and>): Promise<MarkClip | undefined> {
  const c = schema.clips
  const r = schema.recordings
  const e = schema.events
  const [row] = await db.select({
    id: c.id, clubId: c.clubId, title: c.title, status: c.status, durationMs: c.durationMs, startMs: c.startMs, endMs: c.endMs,
    objectKey: c.objectKey, posterKey: c.posterKey, frameRate: r.frameRate, published: e.published,
  }).from(c)
    .innerJoin(r, eq(r.id, c.recordingId))
    .innerJoin(e, eq(e.id, r.eventId))
    .where(where)
  if (!row) return undefined
  const { startMs, endMs, frameRate, published, ...rest } = row
  return {
    ...rest,
    // Until ffprobe has read the cut file, the window asked for is the best length known.
    durationMs: row.durationMs ?? endMs - startMs,
    frameRate: frameRateOf(frameRate),
    hasVideo: row.status === 'ready' && row.objectKey !== null,
    hasPoster: row.posterKey !== null,
    isPublic: published && row.status === 'ready' && row.objectKey !== null,
  }
}

/** A clip of the club with what marking needs (its length, its recording's frame rate), or 404. */
export async function findMarkClip(db: DbTx, clubId: number, clipId: number): Promise<MarkClip> {
  const clip = await loadClip(db, and(eq(schema.clips.id, clipId), eq(schema.clips.clubId, clubId)))
  if (!clip) throw notFoundError('Clip')
  return clip
}

/** A clip anyone may watch: cut and ready, from a published event. Anything else is 404. */
export async function findPublicClip(db: DbTx, clipId: number): Promise<MarkClip> {
  const clip = await loadClip(db, and(eq(schema.clips.id, clipId), eq(schema.clips.status, 'ready'), eq(schema.events.published, true)))
  if (!clip?.hasVideo) throw notFoundError('Clip')
  return clip
}

export function markClipView(clip: MarkClip): MarkClipView {
  const { id, title, status, durationMs, frameRate, hasVideo, hasPoster, isPublic } = clip
  return { id, title, status, durationMs, frameRate, hasVideo, hasPoster, isPublic }
}

/** The club's kinds in its order. A club that has none gets the default list written first. */
export async function clubMarkKinds(db: DbTx, clubId: number) {
  const k = schema.markKinds
  const list = () => db.select({ id: k.id, name: k.name, position: k.position }).from(k).where(eq(k.clubId, clubId)).orderBy(asc(k.position), asc(k.id))
  const kinds = await list()
  if (kinds.length > 0) return kinds
  // Two first visits at once: the unique name index keeps one copy of each.
  await db.insert(k).values(DEFAULT_MARK_KINDS.map((name, position) => ({ clubId, name, position }))).onConflictDoNothing()
  return list()
}

export async function markKindsView(db: DbTx, clubId: number): Promise<{ kinds: MarkKindView[] }> {
  const k = schema.markKinds
  const m = schema.marks
  const kinds = await clubMarkKinds(db, clubId)
  const used = await db.select({ kindId: m.kindId, n: count() }).from(m)
    .innerJoin(k, eq(k.id, m.kindId)).where(eq(k.clubId, clubId)).groupBy(m.kindId)
  const uses = new Map(used.map(u => [u.kindId, u.n]))
  return { kinds: kinds.map(kind => ({ id: kind.id, name: kind.name, usedBy: uses.get(kind.id) ?? 0 })) }
}

export async function nextKindPosition(db: DbTx, clubId: number): Promise<number> {
  const [row] = await db.select({ top: max(schema.markKinds.position) }).from(schema.markKinds).where(eq(schema.markKinds.clubId, clubId))
  return (row?.top ?? -1) + 1
}

export function kindNameTaken(name: string) {
  return fieldError(409, 'name', `The club already has a kind named “${name}”`)
}

/** 400 on kindId unless the kind is one of the club's. */
export async function checkMarkKind(db: DbTx, clubId: number, kindId: number | null | undefined) {
  if (kindId === null || kindId === undefined) return
  const k = schema.markKinds
  const [kind] = await db.select({ id: k.id }).from(k).where(and(eq(k.id, kindId), eq(k.clubId, clubId)))
  if (!kind) throw fieldError(400, 'kindId', 'Choose one of the club’s kinds')
}

/** 400 on atMs when the time is past the clip's end. */
export function checkMarkTime(atMs: number | undefined, clip: Pick<MarkClipView, 'durationMs'>) {
  if (atMs !== undefined && atMs > clip.durationMs) {
    throw fieldError(400, 'atMs', `The clip is ${(clip.durationMs / 1000).toFixed(2)} s long: give a time within it`)
  }
}

/** The clip's marks in time order, each with its kind's name. */
export async function clipMarkViews(db: DbTx, clipId: number, markId?: number): Promise<MarkView[]> {
  const m = schema.marks
  const k = schema.markKinds
  return db.select({ id: m.id, atMs: m.atMs, kindId: m.kindId, kind: k.name, label: m.label, comment: m.comment, entryId: m.entryId })
    .from(m).leftJoin(k, eq(k.id, m.kindId))
    .where(markId === undefined ? eq(m.clipId, clipId) : and(eq(m.clipId, clipId), eq(m.id, markId)))
    .orderBy(asc(m.atMs), asc(m.id))
}

export async function markCountByKind(db: DbTx, kindId: number): Promise<number> {
  const [row] = await db.select({ n: count() }).from(schema.marks).where(eq(schema.marks.kindId, kindId))
  return row?.n ?? 0
}

const RANGE = /^bytes=(?:\d+-\d*|-\d+)$/

/**
 * Streams a stored clip file, honouring a single byte range (RFC 9110 §14) so a video can seek
 * without downloading the whole file first. Bad or multiple ranges get the whole file.
 */
export async function sendClipFile(event: H3Event, key: string, headers: Record<string, string>) {
  const { client, bucket } = useS3()
  const asked = getRequestHeader(event, 'range')
  const range = asked && RANGE.test(asked.trim()) ? asked.trim() : undefined
  let object
  try {
    object = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key, Range: range }))
  }
  catch (err) {
    const status = (err as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode
    if (status === 416) {
      throw createError({ statusCode: 416, statusMessage: 'Range Not Satisfiable', message: 'range: outside the file' })
    }
    throw notFoundError('File')
  }
  if (!object.Body) throw notFoundError('File')
  const sent: Record<string, string> = {
    'content-type': object.ContentType ?? 'application/octet-stream',
    'accept-ranges': 'bytes',
    'x-content-type-options': 'nosniff',
    ...(object.ContentLength !== undefined ? { 'content-length': String(object.ContentLength) } : {}),
    ...(object.ContentRange ? { 'content-range': object.ContentRange } : {}),
    ...(object.ETag ? { etag: object.ETag } : {}),
    ...headers,
  }
  setResponseHeaders(event, sent)
  if (range && object.ContentRange) setResponseStatus(event, 206)
  return sendStream(event, object.Body as Readable)
}

export const clipFileSchema = z.enum(['video', 'poster', 'marks.vtt'], { error: 'Unknown file' })

/** A clip's video, poster or marks track; `visibility` sets who may cache it. */
export async function sendClipMedia(event: H3Event, clip: MarkClip, file: z.infer<typeof clipFileSchema>, visibility: 'public' | 'private') {
  if (file === 'marks.vtt') {
    setResponseHeaders(event, {
      'content-type': 'text/vtt; charset=utf-8',
      'cache-control': visibility === 'public' ? 'public, max-age=60' : 'private, no-store',
      'x-content-type-options': 'nosniff',
    })
    return marksToVtt(await clipMarkViews(useDb(), clip.id), { title: clip.title })
  }
  const key = file === 'video' ? (clip.hasVideo ? clip.objectKey : null) : clip.posterKey
  if (!key) throw notFoundError('File')
  return sendClipFile(event, key, { 'cache-control': `${visibility}, max-age=300` })
}
