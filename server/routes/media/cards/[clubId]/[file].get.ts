import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { idParamSchema } from '#shared/schemas/club'

// The studio's cards and batch ZIPs: for the club's editors only, since a card may show an event
// that is not published yet. Public link previews have their own route (/cards/og/…).
const params = z.object({
  clubId: idParamSchema,
  file: z.string().regex(/^(?:[0-9a-f]{64}\.png|batch-\d{1,10}\.zip)$/, { error: 'Unknown file' }),
})
const query = z.object({
  // A file name for the download, without its extension.
  download: z.string().regex(/^[\w.-]{1,120}$/, { error: 'Use letters, digits, dots and hyphens' }).optional(),
})

export default defineEventHandler(async (event) => {
  const { clubId, file } = validParams(event, params)
  const { download } = validQuery(event, query)
  await requireClubRole(event, clubId, ['editor'])
  const disposition = (ext: string): Record<string, string> => (download ? { 'content-disposition': `attachment; filename="${download}.${ext}"` } : {})
  if (file.endsWith('.png')) {
    return sendStored(event, cardKey(clubId, file.slice(0, -4)), {
      'content-type': 'image/png',
      // The name is the hash of the picture's content: it never changes.
      'cache-control': 'private, max-age=31536000, immutable',
      ...disposition('png'),
    })
  }
  const b = schema.cardBatches
  const [batch] = await useDb().select().from(b).where(and(eq(b.id, Number(file.slice(6, -4))), eq(b.clubId, clubId)))
  if (!batch?.zipKey) throw notFoundError('File')
  return sendStored(event, batch.zipKey, { 'content-type': 'application/zip', 'cache-control': 'private, no-store', ...disposition('zip') })
})
