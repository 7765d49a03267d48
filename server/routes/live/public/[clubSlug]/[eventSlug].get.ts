// Every ring of a published event, for the public live page.
export default defineEventHandler(async (event) => {
  const { clubSlug, eventSlug } = validParams(event, publicEventParams)
  const row = await publishedEvent(clubSlug, eventSlug)
  const scope = { kind: 'event' as const, rings: allRings(row.rings) }
  await useLiveHub().stream(event.node.res, row.id, scope, parseLastEventId(lastEventId(event), scope))
})
