import { z } from 'zod'

const drawSchema = z.object({
  // The same key and the same checked-in fighters always give the same pools.
  drawKey: z.string({ error: 'Send the draw key as text' }).trim()
    .min(1, { error: 'Leave the draw key out for a new random draw, or give at least one character' })
    .max(64, { error: 'Use at most 64 characters' }).optional(),
  dryRun: z.boolean({ error: 'Say whether this is a preview (true) or the draw (false)' }).default(false),
}).strict()

// Draws the pools from the checked-in fighters, in place of any earlier draw, as long as no pool
// match has been started. A dry run shows the pools and writes nothing.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, tournamentParams)
  await requireClubRole(event, ids.clubId, ['organizer'])
  const { drawKey, dryRun } = await validBody(event, drawSchema)
  const key = drawKey ?? newDrawKey()
  const result = await useDb().transaction(async (tx) => {
    const { tournament, event: row } = await findTournament(tx, ids, { lock: true })
    if (tournament.phase === 'entries') {
      throw conflictError('Start the pools phase first: the rules are frozen then, and the pools are drawn from the fighters checked in by that time')
    }
    requirePhase(tournament, ['pools'], 'drawing the pools')
    const existing = await loadPools(tx, tournament.id)
    if (await poolsHaveResults(tx, existing.map(p => p.pool.id))) {
      throw conflictError('A pool match already has entries or a result, so the pools can no longer be drawn again')
    }
    const checkedIn = [...(await fighterRefs(tx, tournament.id)).values()]
      .filter(ref => ref.status === 'checked-in')
      .sort((a, b) => a.entryId - b.entryId)
    const plan = planDraw(tournament, checkedIn, key)
    if (dryRun) {
      return { pools: plan.pools.map((members, i) => draftView(i + 1, (i % row.rings) + 1, members)), notes: plan.notes }
    }
    await writeDraw(tx, tournament.id, row.rings, plan)
    await markRingsDirty(tx, tournament.eventId)
    return { pools: await poolViews(tx, tournament), notes: plan.notes }
  })
  if (!dryRun) setResponseStatus(event, 201)
  return { ...result, drawKey: key, dryRun }
})
