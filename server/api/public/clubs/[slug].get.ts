import { z } from 'zod'
import { eq } from 'drizzle-orm'
import { slugSchema } from '#shared/schemas/club'

const params = z.object({ slug: slugSchema })

export default defineEventHandler(async (event) => {
  const { slug } = validParams(event, params)
  const [club] = await useDb().select().from(schema.clubs).where(eq(schema.clubs.slug, slug))
  if (!club) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Club not found' })
  return publicClub(club)
})
