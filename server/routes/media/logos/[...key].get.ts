import { z } from 'zod'

// Club logos are public (they appear on the club site); the key holds a random part.
const params = z.object({ key: z.string().regex(/^\d+\/[0-9a-f]{32}\.(?:png|jpg|webp)$/, { error: 'Unknown file' }) })

export default defineEventHandler(async (event) => {
  const { key } = validParams(event, params)
  const object = await getObject(`logos/${key}`).catch(() => null)
  if (!object?.Body) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'File not found' })
  setResponseHeaders(event, {
    'content-type': object.ContentType ?? 'application/octet-stream',
    'cache-control': 'public, max-age=31536000, immutable',
    'x-content-type-options': 'nosniff',
  })
  return Buffer.from(await object.Body.transformToByteArray())
})
