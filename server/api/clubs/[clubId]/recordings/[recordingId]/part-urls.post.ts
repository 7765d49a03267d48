import { partCount } from '#shared/footage'
import { partUrlsSchema } from '#shared/schemas/footage'

/** Presigned PUT addresses for some parts of an open upload; each expires within minutes. */
export default defineEventHandler(async (event) => {
  const { clubId, recordingId } = validParams(event, recordingParams)
  await requireClubRole(event, clubId, FOOTAGE_ROLES)
  const { partNumbers } = await validBody(event, partUrlsSchema)
  const rec = await findRecording(useDb(), clubId, recordingId)
  if (rec.status !== 'uploading' || !rec.uploadId) throw conflictError('The upload of this recording is finished')
  const count = partCount(rec.bytes, rec.partSize)
  const beyond = partNumbers.find(n => n > count)
  if (beyond !== undefined) throw fieldError(400, 'partNumbers', `The file has ${count} part${count === 1 ? '' : 's'}; there is no part ${beyond}`)
  const urls = await Promise.all([...new Set(partNumbers)].map(async partNumber => ({
    partNumber,
    url: await presignedPartUrl(rec.objectKey, rec.uploadId!, partNumber, PART_URL_SECONDS),
  })))
  return { urls, expiresInSeconds: PART_URL_SECONDS }
})
