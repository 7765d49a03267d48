import { randomBytes } from 'node:crypto'
import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, ['admin'])

  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: 'logo: send the file as multipart/form-data' })
  }
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (length > MAX_LOGO_BYTES + 64 * 1024) throw fieldError(400, 'logo', 'The file is larger than 2 MB')
  const parts = await readMultipartFormData(event).catch(() => {
    throw fieldError(400, 'logo', 'The upload could not be read')
  })
  const file = parts?.find(part => part.name === 'logo' && part.filename !== undefined)
  if (!file || file.data.length === 0) throw fieldError(400, 'logo', 'Choose an image file')
  if (file.data.length > MAX_LOGO_BYTES) throw fieldError(400, 'logo', 'The file is larger than 2 MB')
  const kind = sniffImageType(file.data)
  if (!kind) throw fieldError(400, 'logo', 'Use a PNG, JPEG or WebP image')

  const db = useDb()
  const [club] = await db.select().from(schema.clubs).where(eq(schema.clubs.id, clubId))
  if (!club) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Club not found' })
  // A random key: a new logo gets a new URL (so caches never show the old one) that nobody can guess.
  const key = `logos/${clubId}/${randomBytes(16).toString('hex')}.${IMAGE_EXTENSIONS[kind]}`
  await putObject(key, file.data, kind)
  await db.update(schema.clubs).set({ logoKey: key }).where(eq(schema.clubs.id, clubId))
  if (club.logoKey) await deleteObject(club.logoKey).catch(() => {})
  return { logoUrl: logoUrl({ logoKey: key }) }
})
