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
