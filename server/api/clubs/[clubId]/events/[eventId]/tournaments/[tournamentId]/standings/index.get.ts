/**
 * Every pool's table, the overall ranking and who can still reach the finals. A write can happen
 * here: the first time a final table needs the lot, its seed and order are recorded.
 */
export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, [])
  return useDb().transaction(async (tx) => {
    const { tournament } = await findTournament(tx, ids)
    const cut = { topN: tournament.qualifyCount, minSurvivalRate: tournament.frozenRules?.qualification.minSurvivalRate ?? null }
    const loaded = tournament.phase === 'entries' ? [] : await loadPools(tx, tournament.id)
    if (loaded.length === 0) return { pools: [], overall: null, qualification: null, cut }
    const tables = await tournamentTables(tx, tournament, loaded)
    return { pools: tables.pools, overall: tables.overall, qualification: tables.qualification, cut: tables.cut }
  })
})
