// One ring's stream for its overlay, opened with the ring's read-only token (no sign-in inside
// recording software). A rotated token is refused, and streams opened with it are closed.
export default defineEventHandler(async (event) => {
  const { token } = validParams(event, tokenParams)
  const { eventId, ring } = await ringByToken(token)
  const scope = { kind: 'ring' as const, ring }
  await useLiveHub().stream(event.node.res, eventId, scope, parseLastEventId(lastEventId(event), scope), token)
})
