import { eq } from 'drizzle-orm'
import { recordingPatchSchema } from '#shared/schemas/footage'

/**
 * Renames a recording, enters its start when the file had none, or sets the sync offset: moving
 * one mark onto its frame sets the offset, and every mark of the recording follows.
 */
export default defineEventHandler(async (event) => {
  const { clubId, recordingId } = validParams(event, recordingParams)
  await requireClubRole(event, clubId, FOOTAGE_ROLES)
  const body = await validBody(event, recordingPatchSchema)
  const db = useDb()
  const rec = await findRecording(db, clubId, recordingId)
  if (body.offsetMs !== undefined && !rec.startsAt && !body.startsAt) throw fieldError(400, 'offsetMs', 'Enter when the recording started first')
  const [saved] = await db.update(schema.recordings).set({
    ...(body.title === undefined ? {} : { title: body.title }),
    ...(body.startsAt === undefined ? {} : { startsAt: new Date(body.startsAt), startSource: 'entered' as const }),
    ...(body.offsetMs === undefined ? {} : { offsetMs: body.offsetMs }),
  }).where(eq(schema.recordings.id, rec.id)).returning()
  return { recording: recordingView(saved!), matches: saved!.status === 'ready' ? await recordingMarks(db, saved!) : [] }
})
