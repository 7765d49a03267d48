import { eq } from 'drizzle-orm'

/** Gives up an upload: the store drops its parts and the recording is removed. */
export default defineEventHandler(async (event) => {
  const { clubId, recordingId } = validParams(event, recordingParams)
  await requireClubRole(event, clubId, FOOTAGE_ROLES)
  const db = useDb()
  const rec = await findRecording(db, clubId, recordingId)
  if (rec.status !== 'uploading' || !rec.uploadId) throw conflictError('The upload of this recording is finished')
  await abortMultipartUpload(rec.objectKey, rec.uploadId)
  await db.delete(schema.recordings).where(eq(schema.recordings.id, rec.id))
  return { aborted: true }
})
