import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const { clubId, eventId } = validParams(event, eventParams)
  await requireClubRole(event, clubId, ['organizer'])
  await useDb().transaction(async (tx) => {
    await findEvent(tx, clubId, eventId, { lock: true })
    // Locking the tournaments waits for any phase change in flight.
    const started = await tx.select({ name: schema.tournaments.name, phase: schema.tournaments.phase })
      .from(schema.tournaments).where(eq(schema.tournaments.eventId, eventId)).for('update')
    const begun = started.filter(t => t.phase !== 'entries')
    if (begun.length > 0) {
      throw conflictError(`The event cannot be deleted: ${begun.map(t => `“${t.name}”`).join(', ')} already started. Unpublish it instead.`)
    }
    await tx.delete(schema.events).where(eq(schema.events.id, eventId))
  })
  setResponseStatus(event, 204)
  return null
})
