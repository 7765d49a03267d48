import { count, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, fighterId } = validParams(event, fighterParams)
  await requireClubRole(event, clubId, ['organizer'])
  const inUse = () => conflictError('This fighter has tournament entries, so results would lose their name. Remove the entries first.')
  const photoKey = await useDb().transaction(async (tx) => {
    const fighter = await findFighter(tx, clubId, fighterId)
    const [entered] = await tx.select({ n: count() }).from(schema.entries).where(eq(schema.entries.fighterId, fighterId))
    if ((entered?.n ?? 0) > 0) throw inUse()
    await tx.delete(schema.fighters).where(eq(schema.fighters.id, fighterId))
    return fighter.photoKey
  }).catch((err: unknown) => {
    // Entered at the same moment: the foreign key decides.
    if (isForeignKeyViolation(err)) throw inUse()
    throw err
  })
  if (photoKey) await deleteObject(photoKey).catch(() => {})
  setResponseStatus(event, 204)
  return null
})
