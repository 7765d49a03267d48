import { and, eq } from 'drizzle-orm'
import { markKindPatchSchema } from '#shared/schemas/marks'

export default defineEventHandler(async (event) => {
  const { clubId, kindId } = validParams(event, markKindParams)
  await requireClubRole(event, clubId, MARK_KIND_ROLES)
  const { name } = await validBody(event, markKindPatchSchema)
  const k = schema.markKinds
  const db = useDb()
  const [renamed] = await db.update(k).set({ name, updatedAt: new Date() })
    .where(and(eq(k.id, kindId), eq(k.clubId, clubId))).returning({ id: k.id })
    .catch((err: unknown) => {
      if (isUniqueViolation(err)) throw kindNameTaken(name)
      throw err
    })
  if (!renamed) throw notFoundError('Kind')
  return markKindsView(db, clubId)
})
