// The clip with what the editor needs to mark it (length, frame rate), and its marks in time order.
export default defineEventHandler(async (event) => {
  const { clubId, clipId } = validParams(event, markClipParams)
  await requireClubRole(event, clubId, MARK_ROLES)
  const db = useDb()
  const clip = await findMarkClip(db, clubId, clipId)
  return { clip: markClipView(clip), marks: await clipMarkViews(db, clipId) }
})
