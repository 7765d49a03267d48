import { randomBytes } from 'node:crypto'
import { and, asc, between, eq, inArray, isNotNull } from 'drizzle-orm'
import { z } from 'zod'
import { deriveMatch } from '#shared/rules'
import { idParamSchema } from '#shared/schemas/club'
import { DESK_MARK_KINDS, entryMark, partCount, positionInRecording, suggestWindows } from '#shared/footage'
import type { RingMatch, SyncMark } from '#shared/footage'
import type { DbTx } from './events'

// Recordings and clips: finding them within the club, what the pages are shown, and where the
// desk's entries fall in a recording. A recording belongs to one ring of one event; the desk's
// entries of the matches fenced in that ring become its marks.

type Recording = typeof schema.recordings.$inferSelect
type Clip = typeof schema.clips.$inferSelect

/** Who uploads, syncs and cuts footage (the navigation shows Footage to the same roles). */
export const FOOTAGE_ROLES = ['commentator', 'editor'] as const

export const recordingParams = clubParams.extend({ recordingId: idParamSchema })
export const clipParams = clubParams.extend({ clipId: idParamSchema })

/** Presigned part addresses expire quickly: a part of a few MiB goes up in well under that. */
export const PART_URL_SECONDS = 10 * 60
/** Long enough to watch a recording and step through it. */
export const PLAY_URL_SECONDS = 2 * 60 * 60
/** ffprobe and ffmpeg read through this; a job that outlives it is taken back by the queue anyway. */
export const JOB_URL_SECONDS = 30 * 60

/** An object key nobody can guess: 128 random bits, nothing from the file's name. */
export function randomObjectKey(folder: string, clubId: number, extension = '') {
  return `${folder}/${clubId}/${randomBytes(16).toString('hex')}${extension}`
}

export async function findRecording(db: DbTx, clubId: number, recordingId: number, options: { lock?: boolean } = {}) {
  const r = schema.recordings
  const query = db.select().from(r).where(and(eq(r.id, recordingId), eq(r.clubId, clubId)))
  const [row] = options.lock ? await query.for('update') : await query
  if (!row) throw notFoundError('Recording')
  return row
}

export function recordingView(rec: Recording) {
  return {
    id: rec.id,
    eventId: rec.eventId,
    ring: rec.ringNumber,
    title: rec.title,
    fileName: rec.fileName,
    contentType: rec.contentType,
    bytes: rec.bytes,
    status: rec.status,
    error: rec.error,
    partSize: rec.partSize,
    partCount: partCount(rec.bytes, rec.partSize),
    durationMs: rec.durationMs,
    frameRate: rec.frameRate,
    width: rec.width,
    height: rec.height,
    startsAt: rec.startsAt,
    startSource: rec.startSource,
    offsetMs: rec.offsetMs,
    createdAt: rec.createdAt,
  }
}

export type RecordingView = ReturnType<typeof recordingView>

export async function clipView(clip: Clip) {
  const ready = clip.status === 'ready'
  return {
    id: clip.id,
    recordingId: clip.recordingId,
    matchId: clip.matchId,
    boutNumber: clip.boutNumber,
    title: clip.title,
    startMs: clip.startMs,
    endMs: clip.endMs,
    mode: clip.mode,
    requestedMode: clip.requestedMode,
    toleranceMs: clip.toleranceMs,
    cutStartMs: clip.cutStartMs,
    status: clip.status,
    progress: clip.progress,
    durationMs: clip.durationMs,
    error: clip.error,
    videoUrl: ready && clip.objectKey ? await presignedGet(clip.objectKey, PLAY_URL_SECONDS, 'video/mp4') : null,
    posterUrl: ready && clip.posterKey ? await presignedGet(clip.posterKey, PLAY_URL_SECONDS, 'image/jpeg') : null,
    createdAt: clip.createdAt,
  }
}

export function recordingNotReady(rec: Recording, doing: string) {
  return createError({ statusCode: 409, statusMessage: 'Conflict', message: `The recording is ${rec.status}: ${doing} once it is ready` })
}

/**
 * The desk's entries that fall inside the recording, as marks per match of its ring, with the
 * suggested clip windows. Entries taken back (and the cancels themselves) make no mark.
 */
export async function recordingMarks(db: DbTx, rec: Recording): Promise<RingMatch[]> {
  if (!rec.startsAt || rec.durationMs === null) return []
  const from = new Date(rec.startsAt.getTime() - rec.offsetMs)
  const to = new Date(from.getTime() + rec.durationMs)
  const e = schema.matchEntries
  const m = schema.matches
  const t = schema.tournaments
  const p = schema.pools
  const [event] = await db.select({ rings: schema.events.rings }).from(schema.events).where(eq(schema.events.id, rec.eventId))
  if (!event) return []
  const touched = await db.selectDistinct({ match: m, tournament: t, poolRing: p.ringNumber, poolNumber: p.number })
    .from(e).innerJoin(m, eq(m.id, e.matchId)).innerJoin(t, eq(t.id, m.tournamentId)).leftJoin(p, eq(p.id, m.poolId))
    .where(and(eq(t.eventId, rec.eventId), isNotNull(t.frozenRules), between(e.recordedAt, from, to)))
  const onRing = touched.filter(row => ringOf(row.match.poolId === null ? null : row.poolRing, event.rings) === rec.ringNumber)
  if (onRing.length === 0) return []
  const logs = await matchLogs(db, onRing.map(row => row.match.id))
  const refsByTournament = new Map<number, Map<number, FighterRef>>()
  const out: RingMatch[] = []
  for (const row of onRing) {
    const { match, tournament } = row
    let refs = refsByTournament.get(tournament.id)
    if (!refs) refsByTournament.set(tournament.id, refs = await fighterRefs(db, tournament.id))
    const log = logs.get(match.id)!
    const state = deriveMatch(rulesOf(tournament), payloads(log))
    const marks: SyncMark[] = []
    log.forEach((entry, i) => {
      const item = state.timeline[i]
      const mark = entryMark(entry.payload)
      if (!item || item.status !== 'applied' || !mark) return
      const atMs = positionInRecording(entry.recordedAt.getTime(), rec.startsAt!.getTime(), rec.offsetMs)
      if (atMs < 0 || atMs > rec.durationMs!) return
      marks.push({ entryId: entry.id, matchId: match.id, bout: item.bout, atMs, label: mark.label, kind: mark.kind })
    })
    if (marks.length === 0) continue
    marks.sort((a, b) => a.atMs - b.atMs)
    const red = match.sideAEntry === null ? null : refs.get(match.sideAEntry)?.name ?? null
    const blue = match.sideBEntry === null ? null : refs.get(match.sideBEntry)?.name ?? null
    const where = match.stage === 'pool' ? `Pool ${row.poolNumber ?? '?'}, match ${match.orderInPool ?? '?'}` : `Final ${match.bracketMatchKey ?? ''}`.trim()
    out.push({
      id: match.id,
      tournamentName: tournament.name,
      label: `${where}: ${red ?? 'to be decided'} v ${blue ?? 'to be decided'}`,
      red,
      blue,
      marks,
      windows: suggestWindows(marks, rec.durationMs),
    })
  }
  return out.sort((a, b) => a.marks[0]!.atMs - b.marks[0]!.atMs)
}

/**
 * The club's kinds of mark by lower-cased name: the club's default list when it has none yet, and
 * hit, afterblow and double made if missing.
 */
export async function defaultMarkKinds(tx: DbTx, clubId: number): Promise<Map<string, number>> {
  const k = schema.markKinds
  const existing = await clubMarkKinds(tx, clubId)
  const last = Math.max(0, ...existing.map(kind => kind.position))
  // The unique index on (club, lower(name)) keeps a kind the club already has, in any case.
  await tx.insert(k).values(DESK_MARK_KINDS.map((name, i) => ({ clubId, name, position: last + 1 + i }))).onConflictDoNothing()
  const rows = await tx.select({ id: k.id, name: k.name }).from(k).where(eq(k.clubId, clubId)).orderBy(asc(k.position))
  return new Map(rows.map(row => [row.name.toLowerCase(), row.id]))
}

/** Recordings of the club, newest first, optionally of one event. */
export async function listRecordings(db: DbTx, clubId: number, eventId?: number) {
  const r = schema.recordings
  const rows = await db.select().from(r)
    .where(eventId === undefined ? eq(r.clubId, clubId) : and(eq(r.clubId, clubId), eq(r.eventId, eventId)))
    .orderBy(asc(r.eventId), asc(r.ringNumber), asc(r.createdAt))
  return rows.map(recordingView)
}

export const recordingListQuery = z.object({ eventId: idParamSchema.optional() })

export async function clipsOf(db: DbTx, recordingIds: number[]) {
  if (recordingIds.length === 0) return []
  const c = schema.clips
  return db.select().from(c).where(inArray(c.recordingId, recordingIds)).orderBy(asc(c.createdAt), asc(c.id))
}
