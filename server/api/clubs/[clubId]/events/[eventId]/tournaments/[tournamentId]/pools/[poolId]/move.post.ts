import { z } from 'zod'
import { validateMove } from '#shared/tournament'

const id = (missing: string) => z.number({ error: missing }).int({ error: missing }).positive({ error: missing }).max(2147483647, { error: missing })

const moveSchema = z.object({
  entryId: id('Choose the fighter\'s entry to move'),
  toPoolId: id('Choose the pool to move the fighter to'),
}).strict()

// Moves one fighter to another pool before either pool has started; both pools get their bout
// order again.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, poolParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  const { entryId, toPoolId } = await validBody(event, moveSchema)
  return useDb().transaction(async (tx) => {
    const { tournament } = await findTournament(tx, ids, { lock: true })
    const loaded = await loadPools(tx, tournament.id)
    const fromIndex = loaded.findIndex(p => p.pool.id === ids.poolId)
    if (fromIndex < 0) throw poolNotFound()
    requirePhase(tournament, ['pools'], 'moving fighters between pools')
    const from = loaded[fromIndex]!
    const toIndex = loaded.findIndex(p => p.pool.id === toPoolId)
    if (toIndex < 0) throw fieldError(400, 'toPoolId', 'No pool with this id in this tournament')
    const to = loaded[toIndex]!
    const refs = await fighterRefs(tx, tournament.id)
    const fighter = refs.get(entryId)
    if (!fighter || !from.entryIds.includes(entryId)) throw fieldError(400, 'entryId', `This fighter is not in pool ${from.pool.number}`)
    if (toIndex === fromIndex) throw fieldError(409, 'toPoolId', `${fighter.name} is already in pool ${to.pool.number}`)
    if (await poolsHaveResults(tx, [from.pool.id, to.pool.id])) {
      throw conflictError(`A match of pool ${from.pool.number} or pool ${to.pool.number} already has entries or a result, so their fighters stay where they are`)
    }

    const { entries } = engineEntries(loaded.flatMap(p => p.entryIds.map(e => refs.get(e)!)))
    const byId = new Map(entries.map(e => [e.id, e]))
    const check = validateMove(loaded.map(p => p.entryIds.map(e => byId.get(e)!)), entryId, toIndex)
    if (!check.allowed) throw conflictError(check.reason)

    await clearPools(tx, [from.pool.id, to.pool.id])
    for (const index of [fromIndex, toIndex]) {
      await fillPool(tx, tournament.id, loaded[index]!.pool, check.pools[index]!.map(e => refs.get(e.id)!))
    }
    await markRingsDirty(tx, tournament.eventId)
    return {
      pools: await poolViews(tx, tournament),
      warnings: moveWarnings(check.warnings, fighter, to.pool.number, check.pools.map(p => p.length)),
    }
  })
})
