import { and, count, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, kindId } = validParams(event, markKindParams)
  await requireClubRole(event, clubId, MARK_KIND_ROLES)
  const k = schema.markKinds
  const inUse = (n: number | null) => conflictError(n === null
    ? 'A mark uses this kind, so it cannot be deleted. Give those marks another kind first, or rename this one.'
    : `${n} mark${n === 1 ? ' uses' : 's use'} this kind, so it cannot be deleted. Give ${n === 1 ? 'it' : 'them'} another kind first, or rename this one.`)
  const db = useDb()
  await db.transaction(async (tx) => {
    await tx.select({ id: schema.clubs.id }).from(schema.clubs).where(eq(schema.clubs.id, clubId)).for('update')
    const [kind] = await tx.select({ id: k.id }).from(k).where(and(eq(k.id, kindId), eq(k.clubId, clubId)))
    if (!kind) throw notFoundError('Kind')
    const used = await markCountByKind(tx, kindId)
    if (used > 0) throw inUse(used)
    const [left] = await tx.select({ n: count() }).from(k).where(eq(k.clubId, clubId))
    if ((left?.n ?? 0) <= 1) throw conflictError('This is the club’s last kind: add another before deleting it.')
    await tx.delete(k).where(eq(k.id, kindId))
  }).catch((err: unknown) => {
    // A mark given this kind at the same moment: the foreign key decides.
    if (isForeignKeyViolation(err)) throw inUse(null)
    throw err
  })
  return markKindsView(db, clubId)
})
