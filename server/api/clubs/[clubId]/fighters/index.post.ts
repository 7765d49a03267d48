import { fighterSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, ['organizer'])
  const input = await validBody(event, fighterSchema)
  const [row] = await useDb().insert(schema.fighters).values({ clubId, ...input }).returning()
    .catch((err: unknown) => {
      if (isUniqueViolation(err)) throw fighterTaken()
      throw err
    })
  setResponseStatus(event, 201)
  return fighterView(row!)
})
