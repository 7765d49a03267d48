/** A recording with an address to play it, the desk's marks on its timeline and its clips. */
export default defineEventHandler(async (event) => {
  const { clubId, recordingId } = validParams(event, recordingParams)
  await requireClubRole(event, clubId, FOOTAGE_ROLES)
  const db = useDb()
  const rec = await findRecording(db, clubId, recordingId)
  const ready = rec.status === 'ready'
  return {
    recording: recordingView(rec),
    videoUrl: ready ? await presignedGet(rec.objectKey, PLAY_URL_SECONDS, rec.contentType) : null,
    matches: ready ? await recordingMarks(db, rec) : [],
    clips: await Promise.all((await clipsOf(db, [rec.id])).map(clipView)),
  }
})
