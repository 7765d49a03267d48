// A clip's video (with byte ranges, for seeking), poster and marks track, for the club's
// commentators and editors: the clip may come from an event that is not published yet.
const params = markClipParams.extend({ file: clipFileSchema })

export default defineEventHandler(async (event) => {
  const { clubId, clipId, file } = validParams(event, params)
  await requireClubRole(event, clubId, MARK_ROLES)
  return sendClipMedia(event, await findMarkClip(useDb(), clubId, clipId), file, 'private')
})
