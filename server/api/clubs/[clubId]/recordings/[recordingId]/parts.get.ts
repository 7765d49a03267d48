import { partCount } from '#shared/footage'

/** The parts the store already has (ListParts), so that an interrupted upload sends only the rest. */
export default defineEventHandler(async (event) => {
  const { clubId, recordingId } = validParams(event, recordingParams)
  await requireClubRole(event, clubId, FOOTAGE_ROLES)
  const rec = await findRecording(useDb(), clubId, recordingId)
  if (rec.status !== 'uploading' || !rec.uploadId) throw conflictError('The upload of this recording is finished')
  const parts = await listUploadedParts(rec.objectKey, rec.uploadId)
  if (parts === null) throw conflictError('The object store no longer has this upload; start it again')
  return { uploadId: rec.uploadId, partSize: rec.partSize, partCount: partCount(rec.bytes, rec.partSize), parts }
})
