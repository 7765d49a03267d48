import { eventSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, ['organizer'])
  const input = await validBody(event, eventSchema)
  const [row] = await useDb().insert(schema.events).values({ clubId, ...input }).returning()
    .catch((err: unknown) => {
      if (isUniqueViolation(err)) throw eventSlugTaken()
      throw err
    })
  setResponseStatus(event, 201)
  return { ...eventView(row!), tournaments: [] }
})
