import { and, count, eq } from 'drizzle-orm'
import { nextPhase, phaseChangeSchema } from '#shared/schemas/tournament'
import { openFinalMatches } from '#shared/tournament'

export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  const { to } = await validBody(event, phaseChangeSchema)
  const db = useDb()
  await db.transaction(async (tx) => {
    const { tournament } = await findTournament(tx, ids, { lock: true })
    const next = nextPhase(tournament.phase)
    if (to !== next) {
      throw fieldError(409, 'to', next
        ? `The tournament is in “${tournament.phase}”; the only next phase is “${next}”`
        : 'The tournament is done; its phase cannot change')
    }
    const n = schema.entries
    const [checkedIn] = await tx.select({ n: count() }).from(n)
      .where(and(eq(n.tournamentId, tournament.id), eq(n.status, 'checked-in')))
    const fighters = checkedIn?.n ?? 0
    const change: Partial<typeof schema.tournaments.$inferInsert> = { phase: to }
    if (to === 'pools') {
      if (fighters < 2) throw fieldError(409, 'to', `The pools need at least 2 checked-in fighters; ${fighters} checked in so far`)
      // The copy is taken in this transaction: later edits of the rule set make new versions and never reach it.
      const v = schema.ruleSetVersions
      const [chosen] = await tx.select().from(v)
        .where(and(eq(v.ruleSetId, tournament.ruleSetId), eq(v.version, tournament.ruleSetVersion)))
      const frozen = frozenCopy(chosen!.settings)
      if (!frozen) {
        throw fieldError(409, 'to', `Version ${tournament.ruleSetVersion} of the rule set no longer passes the rule checks; save the rule set again and choose the new version`)
      }
      change.frozenRules = frozen
    }
    if (to === 'finals' && fighters < 2) {
      throw fieldError(409, 'to', 'The finals need at least 2 fighters still in the tournament')
    }
    // The finals are drawn in this transaction, from the overall ranking of the pools.
    if (to === 'finals') await startFinals(tx, tournament)
    if (to === 'done') {
      const finals = await finalsView(tx, tournament)
      const open = openFinalMatches(finals.format, finals.matches)
      if (finals.format !== null && (open.length > 0 || !finals.complete)) {
        const level = open.filter(m => m.status === 'finished').length
        throw fieldError(409, 'to', open.length === 0
          ? 'The finals are not decided yet'
          : `${open.length} final ${open.length === 1 ? 'match is' : 'matches are'} still to be fenced${level > 0 ? ` or settled (${level} ended level: record the director's decision as a forfeit)` : ''}`)
      }
    }
    await tx.update(schema.tournaments).set(change).where(eq(schema.tournaments.id, tournament.id))
    await markRingsDirty(tx, tournament.eventId)
  })
  return tournamentDetail(db, ids)
})
