import { markCreateSchema } from '#shared/schemas/marks'

export default defineEventHandler(async (event) => {
  const { clubId, clipId } = validParams(event, markClipParams)
  const { user } = await requireClubRole(event, clubId, MARK_ROLES)
  const input = await validBody(event, markCreateSchema)
  const db = useDb()
  const clip = await findMarkClip(db, clubId, clipId)
  checkMarkTime(input.atMs, clip)
  await checkMarkKind(db, clubId, input.kindId)
  const [mark] = await db.insert(schema.marks).values({ ...input, clipId, createdBy: user.id }).returning({ id: schema.marks.id })
    .catch((err: unknown) => {
      // The kind was deleted a moment after it was checked.
      if (isForeignKeyViolation(err)) throw fieldError(400, 'kindId', 'Choose one of the club’s kinds')
      throw err
    })
  setResponseStatus(event, 201)
  const [view] = await clipMarkViews(db, clipId, mark!.id)
  return view
})
