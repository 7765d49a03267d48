import { and, eq } from 'drizzle-orm'
import { markPatchSchema } from '#shared/schemas/marks'

export default defineEventHandler(async (event) => {
  const { clubId, clipId, markId } = validParams(event, markParams)
  await requireClubRole(event, clubId, MARK_ROLES)
  const change = await validBody(event, markPatchSchema)
  const db = useDb()
  const clip = await findMarkClip(db, clubId, clipId)
  checkMarkTime(change.atMs, clip)
  await checkMarkKind(db, clubId, change.kindId)
  const m = schema.marks
  const [updated] = await db.update(m).set({ ...change, updatedAt: new Date() })
    .where(and(eq(m.id, markId), eq(m.clipId, clipId))).returning({ id: m.id })
    .catch((err: unknown) => {
      if (isForeignKeyViolation(err)) throw fieldError(400, 'kindId', 'Choose one of the club’s kinds')
      throw err
    })
  if (!updated) throw notFoundError('Mark')
  const [view] = await clipMarkViews(db, clipId, markId)
  return view
})
