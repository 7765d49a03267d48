import type { H3Event } from 'h3'

/**
 * One image from a multipart upload, checked by its content (PNG, JPEG or WebP, at most 2 MB).
 * Errors name the form field.
 */
export async function readImageUpload(event: H3Event, field: string) {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: `${field}: send the file as multipart/form-data` })
  }
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (length > MAX_IMAGE_BYTES + 64 * 1024) throw fieldError(400, field, 'The file is larger than 2 MB')
  const parts = await readMultipartFormData(event).catch(() => {
    throw fieldError(400, field, 'The upload could not be read')
  })
  const file = parts?.find(part => part.name === field && part.filename !== undefined)
  if (!file || file.data.length === 0) throw fieldError(400, field, 'Choose an image file')
  if (file.data.length > MAX_IMAGE_BYTES) throw fieldError(400, field, 'The file is larger than 2 MB')
  const kind = sniffImageType(file.data)
  if (!kind) throw fieldError(400, field, 'Use a PNG, JPEG or WebP image')
  return { data: file.data, kind }
}
