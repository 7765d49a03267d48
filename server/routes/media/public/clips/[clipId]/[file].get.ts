import { z } from 'zod'
import { idParamSchema } from '#shared/schemas/club'

// The same files for anyone, once the clip's event is published (the club site's breakdowns).
const params = z.object({ clipId: idParamSchema, file: clipFileSchema })

export default defineEventHandler(async (event) => {
  const { clipId, file } = validParams(event, params)
  return sendClipMedia(event, await findPublicClip(useDb(), clipId), file, 'public')
})
