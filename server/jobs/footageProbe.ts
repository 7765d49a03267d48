import { and, eq } from 'drizzle-orm'
import type { ProbeResult } from '../utils/ffmpeg'
import type { JobRun } from '.'

// After an upload: ffprobe reads the recording through a short-lived presigned address (no copy
// of the file is made) for its duration, frame rate, size and creation time. A file that is not
// a video fails with a message and its object is deleted. Safe to run again: it only acts on a
// recording still being probed.

export async function probeRecording(data: { recordingId: number }, job: JobRun) {
  const db = useDb()
  const r = schema.recordings
  const [rec] = await db.select().from(r).where(and(eq(r.id, data.recordingId), eq(r.status, 'probing')))
  if (!rec) return
  // A store that does not answer is worth a retry; a file ffprobe cannot read is not.
  await headObject(rec.objectKey)
  const url = await presignedGet(rec.objectKey, JOB_URL_SECONDS)
  let probe: ProbeResult | null = null
  try {
    probe = await ffprobe(url)
  }
  catch (err) {
    if (!(err instanceof FfmpegError)) throw err
    if (!job.lastAttempt && /could not start|stopped/.test(err.message)) throw err
  }
  if (!probe?.hasVideo || probe.durationMs === null) {
    await deleteObject(rec.objectKey).catch(() => {})
    await db.update(r).set({
      status: 'failed',
      error: probe ? 'The file has no video stream that can be read; upload a video file.' : 'The file is not a video that can be read (ffprobe could not open it); upload a video file.',
    }).where(eq(r.id, rec.id))
    return
  }
  const fromFile = rec.startSource !== 'entered' && probe.creationTime !== null
  await db.update(r).set({
    status: 'ready',
    error: null,
    durationMs: probe.durationMs,
    frameRate: probe.frameRate,
    width: probe.width,
    height: probe.height,
    ...(fromFile ? { startsAt: probe.creationTime, startSource: 'file' as const } : {}),
  }).where(and(eq(r.id, rec.id), eq(r.status, 'probing')))
}
