import { and, eq } from 'drizzle-orm'

// Answers the deleted mark, so the editor can offer to put it back (undo adds it again).
export default defineEventHandler(async (event) => {
  const { clubId, clipId, markId } = validParams(event, markParams)
  await requireClubRole(event, clubId, MARK_ROLES)
  const db = useDb()
  await findMarkClip(db, clubId, clipId)
  const [view] = await clipMarkViews(db, clipId, markId)
  const m = schema.marks
  const [deleted] = await db.delete(m).where(and(eq(m.id, markId), eq(m.clipId, clipId))).returning({ id: m.id })
  if (!deleted || !view) throw notFoundError('Mark')
  return view
})
