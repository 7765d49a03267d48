import { and, eq } from 'drizzle-orm'
import { clipRequestSchema } from '#shared/schemas/footage'
import { formatPosition } from '#shared/footage'

/** Asks a worker to cut a window of the recording (a whole match or one bout) into a clip. */
export default defineEventHandler(async (event) => {
  const { clubId, recordingId } = validParams(event, recordingParams)
  const { user } = await requireClubRole(event, clubId, FOOTAGE_ROLES)
  const body = await validBody(event, clipRequestSchema)
  const db = useDb()
  const rec = await findRecording(db, clubId, recordingId)
  if (rec.status !== 'ready' || rec.durationMs === null) throw recordingNotReady(rec, 'cut clips')
  if (body.startMs >= rec.durationMs) throw fieldError(400, 'startMs', `The recording is ${formatPosition(rec.durationMs)} long`)
  if (body.endMs > rec.durationMs + 1000) throw fieldError(400, 'endMs', `The recording is ${formatPosition(rec.durationMs)} long`)
  if (body.matchId !== undefined) {
    const [found] = await db.select({ id: schema.matches.id }).from(schema.matches)
      .innerJoin(schema.tournaments, eq(schema.tournaments.id, schema.matches.tournamentId))
      .where(and(eq(schema.matches.id, body.matchId), eq(schema.tournaments.eventId, rec.eventId)))
    if (!found) throw fieldError(400, 'matchId', 'No match of this recording\'s event has this id')
  }
  const [clip] = await db.insert(schema.clips).values({
    clubId, recordingId: rec.id, matchId: body.matchId ?? null, boutNumber: body.boutNumber ?? null,
    title: body.title ?? `${rec.title}, ${formatPosition(body.startMs)} to ${formatPosition(Math.min(body.endMs, rec.durationMs))}`,
    startMs: body.startMs, endMs: Math.min(body.endMs, rec.durationMs),
    mode: body.mode === 'exact' ? 'exact' : 'copy', requestedMode: body.mode, toleranceMs: body.toleranceMs, createdBy: user.id,
  }).returning()
  try {
    await enqueueJob('footage-clip', { clipId: clip!.id })
  }
  catch (err) {
    await db.update(schema.clips).set({ status: 'failed', error: 'The clip could not be queued; try again' }).where(eq(schema.clips.id, clip!.id))
    throw err
  }
  setResponseStatus(event, 202)
  return { clip: await clipView(clip!) }
})
