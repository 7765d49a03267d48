import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { and, eq, inArray } from 'drizzle-orm'
import { chooseCut } from '#shared/footage'
import type { JobRun } from '.'

// Cuts a clip from a recording with ffmpeg, reading the recording through a short-lived
// presigned address: a stream copy from the keyframe at or before the start when the clip's
// setting allows (fast, no loss), an exact re-encode from the very frame otherwise. Then a poster
// frame, ffprobe of the result, both files to object storage under random keys, and the clip's
// first marks from the desk's entries inside it. Progress goes to clips.progress as ffmpeg
// reports it. Safe to run again: a ready clip is left alone, and a retry cuts afresh.

const PROGRESS_EVERY_MS = 300
/** Where the poster frame is taken: a second in, when the fighters are usually on guard. */
const POSTER_AT_MS = 1000

export async function cutClip(data: { clipId: number }, job: JobRun) {
  const db = useDb()
  const c = schema.clips
  const [clip] = await db.update(c).set({ status: 'cutting', progress: 0, error: null })
    .where(and(eq(c.id, data.clipId), inArray(c.status, ['queued', 'cutting']))).returning()
  if (!clip) return
  const work = await mkdtemp(path.join(tmpdir(), 'unscathed-clip-'))
  try {
    const [rec] = await db.select().from(schema.recordings).where(eq(schema.recordings.id, clip.recordingId))
    if (!rec || rec.status !== 'ready') throw new Error('the recording is not ready')
    const input = await presignedGet(rec.objectKey, JOB_URL_SECONDS)
    const keyframe = clip.requestedMode === 'exact' ? null : await keyframeBefore(input, clip.startMs)
    const cut = chooseCut(clip.requestedMode, clip.startMs, keyframe, clip.toleranceMs)
    const lengthMs = clip.endMs - cut.startMs
    const out = path.join(work, 'clip.mp4')
    let written = 0
    const onProgressMs = (ms: number) => {
      const now = Date.now()
      if (now - written < PROGRESS_EVERY_MS) return
      written = now
      // The last tenth is for the poster, the check and the upload.
      const progress = Math.max(1, Math.min(90, Math.round((ms / lengthMs) * 90)))
      void db.update(c).set({ progress }).where(and(eq(c.id, clip.id), eq(c.status, 'cutting'))).catch(() => {})
    }
    const seconds = (ms: number) => (ms / 1000).toFixed(3)
    const common = ['-map', '0:v:0', '-map', '0:a:0?', '-movflags', '+faststart', '-t', seconds(lengthMs)]
    if (cut.mode === 'copy') {
      // Seeking an input to a keyframe's own time starts the copy exactly on that keyframe.
      await ffmpeg(['-ss', seconds(cut.startMs), '-i', input, ...common, '-c', 'copy', '-avoid_negative_ts', 'make_zero', out], { onProgressMs, timeoutMs: 20 * 60_000 })
    }
    else {
      await ffmpeg(['-ss', seconds(cut.startMs), '-i', input, ...common, '-c:v', 'libx264', '-preset', 'veryfast', '-crf', '20', '-pix_fmt', 'yuv420p', '-c:a', 'aac', '-b:a', '160k', out], { onProgressMs, timeoutMs: 20 * 60_000 })
    }
    const probe = await ffprobe(out)
    if (!probe.hasVideo || probe.durationMs === null) throw new Error('the cut file has no video')
    const poster = path.join(work, 'poster.jpg')
    await ffmpeg(['-ss', seconds(Math.min(POSTER_AT_MS, probe.durationMs / 2)), '-i', out, '-frames:v', '1', '-vf', 'scale=\'min(1280,iw)\':-2', '-q:v', '3', poster], { timeoutMs: 60_000 })
    await db.update(c).set({ progress: 95 }).where(eq(c.id, clip.id))
    const objectKey = randomObjectKey('clips', clip.clubId, '.mp4')
    const posterKey = randomObjectKey('clips', clip.clubId, '.jpg')
    await putFile(objectKey, out, 'video/mp4')
    await putFile(posterKey, poster, 'image/jpeg')
    const matches = await recordingMarks(db, rec)
    await db.transaction(async (tx) => {
      const kinds = await defaultMarkKinds(tx, clip.clubId)
      const [ready] = await tx.update(c).set({
        status: 'ready', progress: 100, mode: cut.mode, cutStartMs: cut.startMs, durationMs: probe.durationMs,
        objectKey, posterKey, error: null,
      }).where(and(eq(c.id, clip.id), eq(c.status, 'cutting'))).returning()
      if (!ready) return
      const inside = matches.filter(m => clip.matchId === null || m.id === clip.matchId).flatMap(m => m.marks)
        .filter(m => m.atMs >= cut.startMs && m.atMs <= cut.startMs + probe.durationMs!)
      if (inside.length === 0) return
      await tx.insert(schema.marks).values(inside.map(m => ({
        clipId: clip.id,
        atMs: m.atMs - cut.startMs,
        label: m.label,
        kindId: m.kind ? kinds.get(m.kind) ?? null : null,
        entryId: isUuid(m.entryId) ? m.entryId : null,
        createdBy: clip.createdBy,
      })))
    })
  }
  catch (err) {
    const message = err instanceof Error ? err.message : String(err)
    await db.update(c).set(job.lastAttempt
      ? { status: 'failed', error: `The clip could not be cut: ${message}` }
      : { status: 'queued', progress: 0, error: `Trying again after: ${message}` }).where(eq(c.id, clip.id)).catch(() => {})
    throw err
  }
  finally {
    await rm(work, { recursive: true, force: true })
  }
}

// marks.entry_id is a uuid; the desk's entry ids are (crypto.randomUUID()), older or imported ones may not be.
const isUuid = (id: string) => /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id)
