// Every ring of a published event as it is now, for the public live page's first paint.
export default defineEventHandler(async (event) => {
  const { clubSlug, eventSlug } = validParams(event, publicEventParams)
  const row = await publishedEvent(clubSlug, eventSlug)
  return useDb().transaction(async (tx) => {
    const rings = []
    for (const ring of allRings(row.rings)) rings.push(await ringSnapshot(tx, row.id, ring))
    return { event: publicEventSummary(row), rings }
  })
})
