import { eq } from 'drizzle-orm'
import { fighterPatchSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const { clubId, fighterId } = validParams(event, fighterParams)
  await requireClubRole(event, clubId, ['organizer'])
  const input = await validBody(event, fighterPatchSchema)
  const db = useDb()
  await findFighter(db, clubId, fighterId)
  const [row] = await db.update(schema.fighters).set(input).where(eq(schema.fighters.id, fighterId)).returning()
    .catch((err: unknown) => {
      if (isUniqueViolation(err)) throw fighterTaken()
      throw err
    })
  if (!row) throw notFoundError('Fighter')
  return fighterView(row)
})
