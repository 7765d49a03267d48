// The ring's live state for its overlay, opened with the ring's read-only token.
export default defineEventHandler(async (event) => {
  const { token } = validParams(event, tokenParams)
  const { eventId, ring } = await ringByToken(token)
  return useDb().transaction(tx => ringSnapshot(tx, eventId, ring))
})
