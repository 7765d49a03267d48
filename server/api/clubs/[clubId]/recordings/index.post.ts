import { and, eq } from 'drizzle-orm'
import { partCount, partSizeFor } from '#shared/footage'
import { recordingCreateSchema } from '#shared/schemas/footage'

/**
 * Opens a recording's multipart upload in object storage. The browser then asks for presigned
 * addresses of the parts and sends the bytes straight to the store.
 */
export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  const { user } = await requireClubRole(event, clubId, FOOTAGE_ROLES)
  const body = await validBody(event, recordingCreateSchema)
  const db = useDb()
  const [found] = await db.select({ rings: schema.events.rings }).from(schema.events)
    .where(and(eq(schema.events.id, body.eventId), eq(schema.events.clubId, clubId)))
  if (!found) throw fieldError(400, 'eventId', 'No event of this club has this id')
  if (body.ring > found.rings) throw fieldError(400, 'ring', `The event has ${found.rings} ring${found.rings === 1 ? '' : 's'}`)
  const objectKey = randomObjectKey('footage', clubId)
  const partSize = partSizeFor(body.bytes)
  const uploadId = await createMultipartUpload(objectKey, body.contentType)
  const [rec] = await db.insert(schema.recordings).values({
    clubId, eventId: body.eventId, ringNumber: body.ring, title: body.title, fileName: body.fileName,
    contentType: body.contentType, bytes: body.bytes, objectKey, uploadId, partSize, uploadedBy: user.id,
  }).returning()
  setResponseStatus(event, 201)
  return { id: rec!.id, uploadId, partSize, partCount: partCount(body.bytes, partSize), recording: recordingView(rec!) }
})
