import { randomBytes } from 'node:crypto'
import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, ['admin'])

  const { data, kind } = await readImageUpload(event, 'logo')

  const db = useDb()
  const [club] = await db.select().from(schema.clubs).where(eq(schema.clubs.id, clubId))
  if (!club) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Club not found' })
  // A random key: a new logo gets a new URL (so caches never show the old one) that nobody can guess.
  const key = `logos/${clubId}/${randomBytes(16).toString('hex')}.${IMAGE_EXTENSIONS[kind]}`
  await putObject(key, data, kind)
  await db.update(schema.clubs).set({ logoKey: key }).where(eq(schema.clubs.id, clubId))
  if (club.logoKey) await deleteObject(club.logoKey).catch(() => {})
  return { logoUrl: logoUrl({ logoKey: key }) }
})
