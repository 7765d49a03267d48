import { deriveMatch } from '#shared/rules'

/** One match with its whole log, the state the engine derives from it and the rules it is fenced under. */
export default defineEventHandler(async (event) => {
  const ids = validParams(event, matchParams)
  await requireClubRole(event, ids.clubId, [])
  const db = useDb()
  const { tournament } = await findTournament(db, ids)
  const match = await findMatch(db, tournament.id, ids.matchId)
  const rules = rulesOf(tournament)
  const log = (await matchLogs(db, [match.id])).get(match.id)!
  const state = deriveMatch(rules, payloads(log))
  return {
    match: matchSummary(match, await fighterRefs(db, tournament.id), state),
    entries: log.map(row => ({ id: row.id, seq: row.seq, payload: row.payload, recordedAt: row.recordedAt })),
    state,
    rules,
  }
})
