import { eq } from 'drizzle-orm'
import { ENDS_BEFORE_START, endsBeforeStart, eventPatchSchema } from '#shared/schemas/tournament'

export default defineEventHandler(async (event) => {
  const { clubId, eventId } = validParams(event, eventParams)
  await requireClubRole(event, clubId, ['organizer'])
  const input = await validBody(event, eventPatchSchema)
  const db = useDb()
  const updated = await db.transaction(async (tx) => {
    const current = await findEvent(tx, clubId, eventId, { lock: true })
    const dates = { startsOn: input.startsOn ?? current.startsOn, endsOn: input.endsOn ?? current.endsOn }
    if (endsBeforeStart(dates)) throw fieldError(400, input.endsOn ? 'endsOn' : 'startsOn', ENDS_BEFORE_START)
    // A published event keeps what its safety notice needs.
    if (current.published && (input.emergencyNumber === '' || input.firstAidPoint === '')) {
      throw fieldError(400, input.emergencyNumber === '' ? 'emergencyNumber' : 'firstAidPoint', 'A published event must show this in its safety notice; unpublish it first')
    }
    const [row] = await tx.update(schema.events).set(input).where(eq(schema.events.id, eventId)).returning()
    await markRingsDirty(tx, eventId)
    return row!
  }).catch((err: unknown) => {
    if (isUniqueViolation(err)) throw eventSlugTaken()
    throw err
  })
  return { ...eventView(updated), tournaments: await tournamentsOf(db, [eventId]) }
})
