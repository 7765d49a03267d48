import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, fighterId } = validParams(event, fighterParams)
  await requireClubRole(event, clubId, ['organizer'])
  const db = useDb()
  const fighter = await findFighter(db, clubId, fighterId)
  await db.update(schema.fighters).set({ photoKey: null }).where(eq(schema.fighters.id, fighterId))
  if (fighter.photoKey) await deleteObject(fighter.photoKey).catch(() => {})
  setResponseStatus(event, 204)
  return null
})
