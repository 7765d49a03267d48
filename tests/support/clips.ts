// Clips for the marks tests, made the way the footage pipeline leaves them: a short H.264/AAC file
// and a poster in object storage (through the S3 SDK, against the fake), and recording and clip rows
// with status 'ready' in PostgreSQL. The cutting itself is tested with the footage pipeline.
import { execFile } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { existsSync } from 'node:fs'
import { mkdir, readFile, rename } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { promisify } from 'node:util'
import { PutObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { db, schema } from './fixtures'

const run = promisify(execFile)

export const S3_ENDPOINT = process.env.FAKE_S3_ENDPOINT ?? 'http://127.0.0.1:4578'
export const CLIP_SECONDS = 6
export const CLIP_FPS = 25

const s3 = new S3Client({
  endpoint: S3_ENDPOINT,
  region: 'us-east-1',
  forcePathStyle: true,
  credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
  requestChecksumCalculation: 'WHEN_REQUIRED',
  responseChecksumValidation: 'WHEN_REQUIRED',
})

let files: Promise<{ video: Buffer, poster: Buffer }> | undefined

/** A 6 s 640×360 25 fps test picture with a tone (ffmpeg's lavfi sources), made once per machine. */
export function testFootage() {
  files ??= (async () => {
    const dir = path.join(tmpdir(), 'unscathed-test-footage')
    await mkdir(dir, { recursive: true })
    const video = path.join(dir, `clip-${CLIP_SECONDS}s-${CLIP_FPS}.mp4`)
    const poster = path.join(dir, `clip-${CLIP_SECONDS}s-${CLIP_FPS}.jpg`)
    if (!existsSync(video)) {
      const partial = `${video}.${process.pid}.mp4`
      await run('ffmpeg', ['-hide_banner', '-loglevel', 'error', '-y',
        '-f', 'lavfi', '-i', `testsrc2=size=640x360:rate=${CLIP_FPS}`,
        '-f', 'lavfi', '-i', 'sine=frequency=440:sample_rate=48000',
        '-t', String(CLIP_SECONDS), '-c:v', 'libx264', '-pix_fmt', 'yuv420p', '-g', String(CLIP_FPS),
        '-c:a', 'aac', '-b:a', '64k', '-movflags', '+faststart', partial])
      await rename(partial, video)
    }
    if (!existsSync(poster)) {
      const partial = `${poster}.${process.pid}.jpg`
      await run('ffmpeg', ['-hide_banner', '-loglevel', 'error', '-y', '-ss', '1', '-i', video, '-frames:v', '1', partial])
      await rename(partial, poster)
    }
    return { video: await readFile(video), poster: await readFile(poster) }
  })()
  return files
}

export async function putTestObject(key: string, body: Buffer, contentType: string) {
  await s3.send(new PutObjectCommand({ Bucket: 'unscathed', Key: key, Body: body, ContentType: contentType }))
}

export interface TestClip { id: number, recordingId: number, eventId: number, durationMs: number }

/** A ready clip of a new recording of an event of the club (a new event, or the one given). */
export async function makeClip(clubId: number, options: { published?: boolean, eventId?: number, frameRate?: number | null, title?: string } = {}): Promise<TestClip> {
  const { video, poster } = await testFootage()
  const tag = randomBytes(16).toString('hex')
  let eventId = options.eventId
  if (eventId === undefined) {
    const [event] = await db.insert(schema.events).values({
      clubId, name: `Footage night ${tag.slice(0, 6)}`, slug: `footage-${tag.slice(0, 12)}`,
      startsOn: '2026-10-03', endsOn: '2026-10-03', rings: 2, published: options.published ?? false,
      publishedAt: options.published ? new Date() : null,
    }).returning()
    eventId = event!.id
  }
  const videoKey = `clips/test/${tag}.mp4`
  const posterKey = `clips/test/${tag}.jpg`
  await putTestObject(videoKey, video, 'video/mp4')
  await putTestObject(posterKey, poster, 'image/jpeg')
  const durationMs = CLIP_SECONDS * 1000
  const [recording] = await db.insert(schema.recordings).values({
    clubId, eventId, ringNumber: 1, title: 'Ring 1, afternoon', fileName: 'ring-1.mp4', contentType: 'video/mp4',
    bytes: video.length, objectKey: `recordings/test/${tag}.mp4`, partSize: 8 * 1024 * 1024, status: 'ready',
    durationMs: 600_000, frameRate: options.frameRate === undefined ? CLIP_FPS : options.frameRate, width: 640, height: 360,
  }).returning()
  const [clip] = await db.insert(schema.clips).values({
    clubId, recordingId: recording!.id, title: options.title ?? 'Pool A, match 3', startMs: 120_000, endMs: 120_000 + durationMs,
    mode: 'exact', status: 'ready', progress: 100, objectKey: videoKey, posterKey, durationMs,
  }).returning()
  return { id: clip!.id, recordingId: recording!.id, eventId, durationMs }
}
