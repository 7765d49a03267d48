// One ring's live state now, for a desk or the cue desk opening it.
export default defineEventHandler(async (event) => {
  const ids = validParams(event, ringParams)
  await requireClubRole(event, ids.clubId, [])
  return useDb().transaction(async (tx) => {
    const row = await findRing(tx, ids)
    return ringSnapshot(tx, row.id, ids.ring)
  })
})
