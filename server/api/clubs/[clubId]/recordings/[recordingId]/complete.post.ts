import { and, eq } from 'drizzle-orm'
import { partCount, partRange } from '#shared/footage'
import { completeUploadSchema } from '#shared/schemas/footage'

/**
 * Closes the upload with the parts' ETags, after checking them against what the store holds,
 * and puts the recording on the queue to be probed.
 */
export default defineEventHandler(async (event) => {
  const { clubId, recordingId } = validParams(event, recordingParams)
  await requireClubRole(event, clubId, FOOTAGE_ROLES)
  const { parts } = await validBody(event, completeUploadSchema)
  const db = useDb()
  const rec = await findRecording(db, clubId, recordingId)
  if (rec.status !== 'uploading' || !rec.uploadId) throw conflictError('The upload of this recording is finished')
  const count = partCount(rec.bytes, rec.partSize)
  const given = new Map(parts.map(p => [p.partNumber, p.etag.replace(/"/g, '')]))
  const stored = await listUploadedParts(rec.objectKey, rec.uploadId)
  if (stored === null) throw conflictError('The object store no longer has this upload; start it again')
  const held = new Map(stored.map(p => [p.partNumber, p]))
  for (let n = 1; n <= count; n++) {
    if (!given.has(n)) throw fieldError(400, 'parts', `Part ${n} of ${count} is not listed`)
    const part = held.get(n)
    if (!part) throw fieldError(400, 'parts', `Part ${n} has not arrived in the store`)
    if (part.etag !== given.get(n)) throw fieldError(400, 'parts', `Part ${n}'s ETag does not match the stored part`)
    const [start, end] = partRange(n, rec.partSize, rec.bytes)
    if (part.size !== end - start) throw fieldError(400, 'parts', `Part ${n} has ${part.size} bytes, not ${end - start}`)
  }
  if (given.size > count) throw fieldError(400, 'parts', `The file has ${count} part${count === 1 ? '' : 's'}`)
  await completeMultipartUpload(rec.objectKey, rec.uploadId, [...given].sort((a, b) => a[0] - b[0]).map(([partNumber, etag]) => ({ partNumber, etag })))
  const r = schema.recordings
  const [done] = await db.update(r).set({ status: 'probing', uploadId: null, error: null })
    .where(and(eq(r.id, rec.id), eq(r.status, 'uploading'))).returning()
  if (!done) throw conflictError('The upload of this recording is finished')
  await enqueueJob('footage-probe', { recordingId: rec.id })
  return { recording: recordingView(done) }
})
