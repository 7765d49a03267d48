import { randomBytes } from 'node:crypto'
import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, fighterId } = validParams(event, fighterParams)
  await requireClubRole(event, clubId, ['organizer'])
  const { data, kind } = await readImageUpload(event, 'photo')
  const db = useDb()
  const fighter = await findFighter(db, clubId, fighterId)
  const key = `fighters/${clubId}/${fighterId}/${randomBytes(16).toString('hex')}.${IMAGE_EXTENSIONS[kind]}`
  await putObject(key, data, kind)
  const [row] = await db.update(schema.fighters).set({ photoKey: key }).where(eq(schema.fighters.id, fighterId)).returning()
  if (fighter.photoKey) await deleteObject(fighter.photoKey).catch(() => {})
  return fighterView(row!)
})
