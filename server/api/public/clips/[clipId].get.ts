import { z } from 'zod'
import { idParamSchema } from '#shared/schemas/club'

const params = z.object({ clipId: idParamSchema })

/** A published clip for the public player: its timing and its marks (no desk links, no authors). */
export default defineEventHandler(async (event) => {
  const { clipId } = validParams(event, params)
  const db = useDb()
  const clip = await findPublicClip(db, clipId)
  const marks = await clipMarkViews(db, clipId)
  return {
    clip: markClipView(clip),
    marks: marks.map(({ entryId: _entryId, ...mark }) => mark),
  }
})
