import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { idParamSchema } from '#shared/schemas/club'
import type { DbTx } from './events'

type Fighter = typeof schema.fighters.$inferSelect

export const fighterParams = z.object({ clubId: idParamSchema, fighterId: idParamSchema })

export function fighterPhotoUrl(fighter: Pick<Fighter, 'id' | 'clubId' | 'photoKey'>): string | null {
  if (!fighter.photoKey) return null
  // The key's random part in the URL: a new photo gets a new URL, so caches never show the old one.
  const version = fighter.photoKey.split('/').pop()!.split('.')[0]
  return `/api/clubs/${fighter.clubId}/fighters/${fighter.id}/photo?v=${version}`
}

export function fighterView(fighter: Fighter) {
  return {
    id: fighter.id,
    name: fighter.name,
    clubName: fighter.clubName,
    email: fighter.email,
    photoUrl: fighterPhotoUrl(fighter),
    createdAt: fighter.createdAt,
    updatedAt: fighter.updatedAt,
  }
}

export async function findFighter(db: DbTx, clubId: number, fighterId: number) {
  const f = schema.fighters
  const [fighter] = await db.select().from(f).where(and(eq(f.id, fighterId), eq(f.clubId, clubId)))
  if (!fighter) throw notFoundError('Fighter')
  return fighter
}

export function fighterTaken() {
  return fieldError(409, 'name', 'The roster already has a fighter with this name from this club')
}

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
  if (length > MAX_LOGO_BYTES + 64 * 1024) throw fieldError(400, field, 'The file is larger than 2 MB')
  const parts = await readMultipartFormData(event).catch(() => {
    throw fieldError(400, field, 'The upload could not be read')
  })
  const file = parts?.find(part => part.name === field && part.filename !== undefined)
  if (!file || file.data.length === 0) throw fieldError(400, field, 'Choose an image file')
  if (file.data.length > MAX_LOGO_BYTES) throw fieldError(400, field, 'The file is larger than 2 MB')
  const kind = sniffImageType(file.data)
  if (!kind) throw fieldError(400, field, 'Use a PNG, JPEG or WebP image')
  return { data: file.data, kind }
}
