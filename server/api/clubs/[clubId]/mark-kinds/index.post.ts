import { eq } from 'drizzle-orm'
import { markKindCreateSchema } from '#shared/schemas/marks'
import { MARK_KINDS_MAX } from '#shared/footage/marks'

export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, MARK_KIND_ROLES)
  const { name } = await validBody(event, markKindCreateSchema)
  const db = useDb()
  await db.transaction(async (tx) => {
    // The club's row is held so two additions at once get different positions.
    await tx.select({ id: schema.clubs.id }).from(schema.clubs).where(eq(schema.clubs.id, clubId)).for('update')
    const kinds = await clubMarkKinds(tx, clubId)
    if (kinds.length >= MARK_KINDS_MAX) throw fieldError(409, 'name', `A club keeps at most ${MARK_KINDS_MAX} kinds`)
    await tx.insert(schema.markKinds).values({ clubId, name, position: await nextKindPosition(tx, clubId) })
  }).catch((err: unknown) => {
    if (isUniqueViolation(err)) throw kindNameTaken(name)
    throw err
  })
  setResponseStatus(event, 201)
  return markKindsView(db, clubId)
})
