import { randomUUID } from 'node:crypto'
import { HeadObjectCommand, ListPartsCommand, S3Client } from '@aws-sdk/client-s3'
import { eq } from 'drizzle-orm'
import { beforeAll, describe, expect, it } from 'vitest'
import { db, makeClub, schema } from '../support/fixtures'
import type { TestClub } from '../support/fixtures'
import type { Client } from '../support/http'
import { as, clean, double, drawPools, makeFixture, record } from '../support/tournament'
import type { Fixture, PoolView } from '../support/tournament'
import { clipStartInRecording, FOOTAGE, FRAME_MS, KEYFRAME_MS, makeFootage, probeJson, readFileBytes } from '../support/footage'

// Footage against the built app, PostgreSQL, the fake S3 (with its presigned addresses) and the
// worker process that probes recordings and cuts clips with Debian's ffmpeg.

const s3 = new S3Client({
  endpoint: process.env.FAKE_S3_ENDPOINT ?? 'http://127.0.0.1:4578',
  region: 'us-east-1',
  forcePathStyle: true,
  credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
  requestChecksumCalculation: 'WHEN_REQUIRED',
  responseChecksumValidation: 'WHEN_REQUIRED',
})
const BUCKET = 'unscathed'

const sleep = (ms: number) => new Promise(resolve => setTimeout(resolve, ms))

async function waitFor<T>(what: string, read: () => Promise<T>, done: (value: T) => boolean, timeoutMs = 30_000): Promise<T> {
  const until = Date.now() + timeoutMs
  for (;;) {
    const value = await read()
    if (done(value)) return value
    if (Date.now() > until) throw new Error(`${what}: still ${JSON.stringify(value)}`)
    await sleep(200)
  }
}

let club: TestClub
let f: Fixture
let pools: PoolView[]
let commentator: Client
let file: string
let bytes: Buffer
let entryTimes: { id: string, at: number }[]
let matchId: number
let ring: number
let recordingStart: number
const base = () => `/api/clubs/${club.id}/recordings`

async function putPart(client: Client, recordingId: number, partNumber: number, partSize: number) {
  const urls = await client.post(`${base()}/${recordingId}/part-urls`, { partNumbers: [partNumber] })
  expect(urls.status).toBe(200)
  const body = bytes.subarray((partNumber - 1) * partSize, Math.min(bytes.length, partNumber * partSize))
  const res = await fetch(urls.data.urls[0].url, { method: 'PUT', body: new Uint8Array(body) })
  expect(res.status).toBe(200)
  return { partNumber, etag: res.headers.get('etag')! }
}

async function readyRecording(id: number) {
  return waitFor('probe', async () => (await commentator.get(`${base()}/${id}`)).data, d => d.recording.status !== 'probing', 30_000)
}

beforeAll(async () => {
  club = await makeClub('footage')
  // The club named one of the default kinds itself already, in its own case.
  await db.insert(schema.markKinds).values({ clubId: club.id, name: 'HIT', position: 0 })
  const organizer = await as(club, 'organizer')
  commentator = await as(club, 'commentator')
  f = await makeFixture(club, organizer, { rings: 2 })
  pools = await drawPools(f)
  const match = pools[0]!.matches[0]!
  matchId = match.id
  ring = pools[0]!.ringNumber
  // Three bouts a little apart, as a desk records them; the server stamps each with its time.
  const entries = [clean('a', 'head', 'cut', randomUUID()), double(['torso', 'cut'], ['arms', 'cut'], randomUUID()), clean('b', 'torso', 'thrust', randomUUID())]
  for (const entry of entries) {
    expect((await record(organizer, f.base, matchId, [entry])).status).toBe(201)
    await sleep(1200)
  }
  const rows = await db.select().from(schema.matchEntries).where(eq(schema.matchEntries.matchId, matchId))
  entryTimes = rows.map(r => ({ id: r.id, at: r.recordedAt.getTime() })).sort((a, b) => a.at - b.at)
  // The camera started about 5 s before the first entry; MP4 keeps whole seconds (ISO/IEC 14496-12, mvhd creation_time).
  recordingStart = Math.floor((entryTimes[0]!.at - 5000) / 1000) * 1000
  file = await makeFootage({ creationTime: new Date(recordingStart) })
  bytes = await readFileBytes(file)
}, 60_000)

describe('footage upload', () => {
  let recordingId: number

  it('opens a multipart upload with a random key, 5 MiB parts and short-lived part addresses', async () => {
    const res = await commentator.post(base(), { eventId: f.eventId, ring, title: 'Ring 1, morning', fileName: 'ring-1.mp4', contentType: 'video/mp4', bytes: bytes.length })
    expect(res.status).toBe(201)
    expect(res.data.partSize).toBe(5 * 1024 * 1024)
    expect(res.data.partCount).toBe(Math.ceil(bytes.length / (5 * 1024 * 1024)))
    expect(res.data.partCount).toBeGreaterThanOrEqual(3)
    recordingId = res.data.id
    const [row] = await db.select().from(schema.recordings).where(eq(schema.recordings.id, recordingId))
    expect(row!.objectKey).toMatch(new RegExp(`^footage/${club.id}/[0-9a-f]{32}$`))
    expect(row!.objectKey).not.toContain('ring-1')
    const urls = await commentator.post(`${base()}/${recordingId}/part-urls`, { partNumbers: [1, 2] })
    expect(urls.status).toBe(200)
    for (const { url } of urls.data.urls) {
      // SigV4 query signing (AWS S3 API reference, "Authenticating Requests: Using Query Parameters").
      const expires = Number(new URL(url).searchParams.get('X-Amz-Expires'))
      expect(expires).toBeGreaterThan(0)
      expect(expires).toBeLessThanOrEqual(15 * 60)
    }
  })

  it('resumes an interrupted upload: the store lists the parts it has and only the rest are sent', async () => {
    const sent = [await putPart(commentator, recordingId, 1, 5 * 1024 * 1024), await putPart(commentator, recordingId, 2, 5 * 1024 * 1024)]
    // The connection drops here; later the page asks what arrived.
    const parts = await commentator.get(`${base()}/${recordingId}/parts`)
    expect(parts.status).toBe(200)
    expect(parts.data.parts.map((p: { partNumber: number }) => p.partNumber)).toEqual([1, 2])
    expect(parts.data.parts.map((p: { etag: string }) => p.etag)).toEqual(sent.map(p => p.etag.replace(/"/g, '')))
    const missing = Array.from({ length: parts.data.partCount }, (_, i) => i + 1).filter(n => n > 2)
    for (const n of missing) sent.push(await putPart(commentator, recordingId, n, 5 * 1024 * 1024))

    const wrong = await commentator.post(`${base()}/${recordingId}/complete`, { parts: sent.map((p, i) => (i === 0 ? { ...p, etag: 'nope' } : p)) })
    expect(wrong.status).toBe(400)
    expect(wrong.data.message).toMatch(/^parts: Part 1's ETag/)
    const short = await commentator.post(`${base()}/${recordingId}/complete`, { parts: sent.slice(0, -1) })
    expect(short.status).toBe(400)
    expect(short.data.data.fields.parts).toMatch(/is not listed/)

    const done = await commentator.post(`${base()}/${recordingId}/complete`, { parts: sent })
    expect(done.status).toBe(200)
    expect(done.data.recording.status).toBe('probing')
    const again = await commentator.post(`${base()}/${recordingId}/complete`, { parts: sent })
    expect(again.status).toBe(409)
  })

  it('probes the recording with ffprobe: duration, frame rate, size and the creation time as its start', async () => {
    const detail = await readyRecording(recordingId)
    expect(detail.recording.status).toBe('ready')
    expect(detail.recording.durationMs).toBeGreaterThanOrEqual(FOOTAGE.seconds * 1000 - FRAME_MS)
    expect(detail.recording.durationMs).toBeLessThanOrEqual(FOOTAGE.seconds * 1000 + 100)
    expect(detail.recording.frameRate).toBe(FOOTAGE.fps)
    expect([detail.recording.width, detail.recording.height]).toEqual([FOOTAGE.width, FOOTAGE.height])
    expect(new Date(detail.recording.startsAt).getTime()).toBe(recordingStart)
    expect(detail.recording.startSource).toBe('file')
    // The stored object is the file, byte for byte.
    const head = await s3.send(new HeadObjectCommand({ Bucket: BUCKET, Key: (await db.select().from(schema.recordings).where(eq(schema.recordings.id, recordingId)))[0]!.objectKey }))
    expect(head.ContentLength).toBe(bytes.length)
    expect(detail.videoUrl).toMatch(/X-Amz-Signature=/)
  })

  it('places each desk entry of the ring on the timeline, and moving one mark moves them all', async () => {
    const detail = (await commentator.get(`${base()}/${recordingId}`)).data
    const match = detail.matches.find((m: { id: number }) => m.id === matchId)
    expect(match).toBeDefined()
    const marks = match.marks as { entryId: string, atMs: number, label: string, bout: number }[]
    expect(marks.map(m => m.entryId)).toEqual(entryTimes.map(e => e.id))
    expect(marks.map(m => m.atMs)).toEqual(entryTimes.map(e => e.at - recordingStart))
    expect(marks.map(m => m.label)).toEqual(['Red hit: head', 'Double: red torso, blue arms', 'Blue hit: torso (thrust)'])
    expect(match.windows.match.startMs).toBe(0)
    expect(match.windows.bouts).toHaveLength(3)

    // The commentator sees the first mark 700 ms late on the picture and moves it there.
    const moved = await commentator.patch(`${base()}/${recordingId}`, { offsetMs: 700 })
    expect(moved.status).toBe(200)
    const after = moved.data.matches.find((m: { id: number }) => m.id === matchId).marks as { atMs: number }[]
    expect(after.map(m => m.atMs)).toEqual(marks.map(m => m.atMs + 700))
    expect((await commentator.patch(`${base()}/${recordingId}`, { offsetMs: 0 })).status).toBe(200)
  })

  it('cuts a copy clip from the keyframe at or before the start, within one keyframe interval', async () => {
    const startMs = 5100
    const endMs = 9100
    const res = await commentator.post(`${base()}/${recordingId}/clips`, { startMs, endMs, mode: 'copy', matchId, title: 'First exchanges' })
    expect(res.status).toBe(202)
    expect(res.data.clip.status).toBe('queued')
    const clip = await waitFor('copy clip', async () => (await commentator.get(`/api/clubs/${club.id}/clips/${res.data.clip.id}`)).data.clip, c => c.status === 'ready' || c.status === 'failed')
    expect(clip.status).toBe('ready')
    expect(clip.mode).toBe('copy')
    expect(clip.progress).toBe(100)
    expect(clip.cutStartMs).toBe(4000)
    const probe = await probeJson(clip.videoUrl)
    expect(probe.streams.find(s => s.codec_type === 'video')?.codec_name).toBe('h264')
    expect(Math.abs(Number(probe.format.duration) * 1000 - (endMs - startMs))).toBeLessThanOrEqual(KEYFRAME_MS)
    expect(Math.abs(clip.durationMs - Number(probe.format.duration) * 1000)).toBeLessThanOrEqual(1)
    const first = await clipStartInRecording(file, clip.videoUrl, startMs - 3000, 6000)
    expect(Math.abs(first - startMs)).toBeLessThanOrEqual(KEYFRAME_MS)
    expect(first).toBeLessThanOrEqual(startMs)
    const poster = await fetch(clip.posterUrl)
    expect(poster.headers.get('content-type')).toBe('image/jpeg')
    // JPEG files start with the SOI marker FF D8 (ITU-T T.81, B.1.1.3).
    expect([...new Uint8Array(await poster.arrayBuffer()).subarray(0, 2)]).toEqual([0xFF, 0xD8])
  })

  it('cuts an exact clip from the very frame asked for, within one frame, and marks the desk entries inside it with the club\'s kinds', async () => {
    const detail = (await commentator.get(`${base()}/${recordingId}`)).data
    const window = detail.matches.find((m: { id: number }) => m.id === matchId).windows.match as { startMs: number, endMs: number }
    const startMs = 3320
    const endMs = window.endMs
    const res = await commentator.post(`${base()}/${recordingId}/clips`, { startMs, endMs, mode: 'auto', toleranceMs: 200, matchId })
    expect(res.status).toBe(202)
    const clip = await waitFor('exact clip', async () => (await commentator.get(`/api/clubs/${club.id}/clips/${res.data.clip.id}`)).data.clip, c => c.status === 'ready' || c.status === 'failed', 60_000)
    expect(clip.status).toBe('ready')
    // The keyframe before 3.32 s is at 2 s, further than 200 ms: auto cuts exactly.
    expect(clip.mode).toBe('exact')
    expect(clip.cutStartMs).toBe(startMs)
    const probe = await probeJson(clip.videoUrl)
    const video = Number(probe.streams.find(s => s.codec_type === 'video')!.duration) * 1000
    expect(Math.abs(video - (endMs - startMs))).toBeLessThanOrEqual(FRAME_MS)
    const first = await clipStartInRecording(file, clip.videoUrl, startMs - 1000, 2000)
    expect(Math.abs(first - startMs)).toBeLessThanOrEqual(FRAME_MS)

    const marks = await db.select().from(schema.marks).where(eq(schema.marks.clipId, clip.id))
    const expected = entryTimes.map(e => e.at - recordingStart - startMs).filter(ms => ms >= 0)
    expect(marks.map(m => m.atMs).sort((a, b) => a - b)).toEqual(expected)
    expect(marks.map(m => m.entryId).sort()).toEqual(entryTimes.map(e => e.id).sort())
    const kinds = await db.select().from(schema.markKinds).where(eq(schema.markKinds.clubId, club.id))
    // The club's "HIT" is used as it is; only the missing kinds were added.
    expect(kinds.map(k => k.name).sort()).toEqual(['HIT', 'afterblow', 'double'])
    const byId = new Map(kinds.map(k => [k.id, k.name]))
    expect(marks.sort((a, b) => a.atMs - b.atMs).map(m => [m.label, byId.get(m.kindId!)])).toEqual([
      ['Red hit: head', 'HIT'], ['Double: red torso, blue arms', 'double'], ['Blue hit: torso (thrust)', 'HIT'],
    ])
  }, 90_000)
})

describe('footage that is not right', () => {
  it('fails a file that is not a video with a clear message and deletes its object', async () => {
    const text = Buffer.from('Wrenmouth Harvest Open: ring 1 notes, not a video\n'.repeat(20))
    const res = await commentator.post(base(), { eventId: f.eventId, ring, title: 'Notes', fileName: 'notes.mp4', contentType: 'video/mp4', bytes: text.length })
    expect(res.status).toBe(201)
    const urls = await commentator.post(`${base()}/${res.data.id}/part-urls`, { partNumbers: [1] })
    const put = await fetch(urls.data.urls[0].url, { method: 'PUT', body: new Uint8Array(text) })
    const done = await commentator.post(`${base()}/${res.data.id}/complete`, { parts: [{ partNumber: 1, etag: put.headers.get('etag') }] })
    expect(done.status).toBe(200)
    const detail = await readyRecording(res.data.id)
    expect(detail.recording.status).toBe('failed')
    expect(detail.recording.error).toMatch(/not a video/)
    const [row] = await db.select().from(schema.recordings).where(eq(schema.recordings.id, res.data.id))
    await expect(s3.send(new HeadObjectCommand({ Bucket: BUCKET, Key: row!.objectKey }))).rejects.toMatchObject({ name: 'NotFound' })
  })

  it('aborts an upload: the store forgets its parts and the recording is gone', async () => {
    const res = await commentator.post(base(), { eventId: f.eventId, ring, title: 'Given up', fileName: 'x.mov', contentType: 'video/quicktime', bytes: 12_000_000 })
    expect(res.status).toBe(201)
    const [row] = await db.select().from(schema.recordings).where(eq(schema.recordings.id, res.data.id))
    expect((await commentator.post(`${base()}/${res.data.id}/abort`)).status).toBe(200)
    expect((await commentator.get(`${base()}/${res.data.id}`)).status).toBe(404)
    await expect(s3.send(new ListPartsCommand({ Bucket: BUCKET, Key: row!.objectKey, UploadId: res.data.uploadId }))).rejects.toMatchObject({ name: 'NoSuchUpload' })
  })

  it('names the field of every bad request', async () => {
    const good = { eventId: f.eventId, ring, title: 'Ring', fileName: 'a.mp4', contentType: 'video/mp4', bytes: 1000 }
    const cases: [unknown, string][] = [
      [{ ...good, contentType: 'image/png' }, 'contentType'],
      [{ ...good, bytes: 50 * 1024 ** 3 }, 'bytes'],
      [{ ...good, bytes: 0 }, 'bytes'],
      [{ ...good, ring: 9 }, 'ring'],
      [{ ...good, ring: 2 + 1 }, 'ring'],
      [{ ...good, eventId: 999_999_999 }, 'eventId'],
      [{ ...good, title: '  ' }, 'title'],
      [{ ...good, extra: 1 }, 'body'],
    ]
    for (const [body, field] of cases) {
      const res = await commentator.post(base(), body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.data.message, JSON.stringify(body)).toMatch(new RegExp(`^${field}: `))
    }
    const open = await commentator.post(base(), good)
    expect((await commentator.post(`${base()}/${open.data.id}/part-urls`, { partNumbers: [2] })).data.message).toMatch(/^partNumbers: /)
    expect((await commentator.post(`${base()}/${open.data.id}/part-urls`, { partNumbers: [0] })).data.message).toMatch(/^partNumbers\.0: /)
    expect((await commentator.post(`${base()}/${open.data.id}/complete`, { parts: [] })).data.message).toMatch(/^parts: /)
    const list = (await commentator.get(base())).data.recordings as { id: number, status: string }[]
    const ready = list.find(r => r.status === 'ready')!
    const clipCases: [unknown, string][] = [
      [{ startMs: 5000, endMs: 4000 }, 'endMs'],
      [{ startMs: -1, endMs: 4000 }, 'startMs'],
      [{ startMs: 0, endMs: 4000, mode: 'fast' }, 'mode'],
      [{ startMs: 0, endMs: 4000, toleranceMs: 20_000 }, 'toleranceMs'],
      [{ startMs: 60_000, endMs: 70_000 }, 'startMs'],
      [{ startMs: 0, endMs: 4000, boutNumber: 1 }, 'matchId'],
      [{ startMs: 0, endMs: 4000, matchId: 999_999_999 }, 'matchId'],
    ]
    for (const [body, field] of clipCases) {
      const res = await commentator.post(`${base()}/${ready.id}/clips`, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.data.message, JSON.stringify(body)).toMatch(new RegExp(`^${field}: `))
    }
    expect((await commentator.patch(`${base()}/${ready.id}`, { offsetMs: 1.5 })).data.message).toMatch(/^offsetMs: /)
    expect((await commentator.patch(`${base()}/${ready.id}`, { startsAt: 'yesterday' })).data.message).toMatch(/^startsAt: /)
    expect((await commentator.patch(`${base()}/${ready.id}`, {})).status).toBe(400)
    // Cutting a recording still uploading is refused, not queued.
    expect((await commentator.post(`${base()}/${open.data.id}/clips`, { startMs: 0, endMs: 1000 })).status).toBe(409)
  })

  it('lets only commentators and editors of the club near the footage', async () => {
    const list = (await commentator.get(base())).data.recordings as { id: number }[]
    const id = list[0]!.id
    for (const role of ['scorekeeper', 'streamer', 'organizer'] as const) {
      const client = await as(club, role)
      expect((await client.get(base())).status).toBe(403)
      expect((await client.post(`${base()}/${id}/clips`, { startMs: 0, endMs: 1000 })).status).toBe(403)
    }
    const editor = await as(club, 'editor')
    expect((await editor.get(`${base()}/${id}`)).status).toBe(200)
    const stranger = await as(await makeClub('footage-other'), 'commentator')
    expect((await stranger.get(base())).status).toBe(404)
    expect((await stranger.get(`/api/clubs/${club.id}/clips/1`)).status).toBe(404)
  })
})
