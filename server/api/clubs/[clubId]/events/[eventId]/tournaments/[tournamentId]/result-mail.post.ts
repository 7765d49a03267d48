import { eq } from 'drizzle-orm'

/**
 * Mails each fighter with an e-mail their pool-summary card. Asking again sends only to those
 * not mailed yet (say, a fighter whose address was added since); nobody gets their card twice.
 */
export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  const { user } = await requireClubRole(event, ids.clubId, ['organizer'])
  const db = useDb()
  const m = schema.mailings
  const mailing = await db.transaction(async (tx) => {
    const { tournament, event: ev } = await findTournament(tx, ids, { lock: true })
    if (!(await poolsFinished(tx, ids.clubId, tournament))) {
      throw fieldError(409, 'tournamentId', 'Result cards can be sent once every pool match is fenced')
    }
    const [existing] = await tx.select().from(m).where(eq(m.tournamentId, tournament.id))
    if (existing?.status === 'queued' || existing?.status === 'running') return existing
    if (existing) {
      const [again] = await tx.update(m).set({ status: 'queued', jobId: null, error: null, finishedAt: null, requestedBy: user.id })
        .where(eq(m.id, existing.id)).returning()
      return again!
    }
    const [row] = await tx.insert(m).values({
      clubId: ids.clubId, kind: 'cards', tournamentId: tournament.id, subject: `Result cards: ${tournament.name}, ${ev.name}`, requestedBy: user.id,
    }).returning()
    return row!
  })
  if (!mailing.jobId) await queueMailing(mailing.id)
  setResponseStatus(event, 202)
  return resultMailState(ids)
})
