// A fighter's photo is personal data: members of the organising club only, never cached by proxies.
export default defineEventHandler(async (event) => {
  const { clubId, fighterId } = validParams(event, fighterParams)
  await requireClubRole(event, clubId, [])
  const fighter = await findFighter(useDb(), clubId, fighterId)
  const object = fighter.photoKey ? await getObject(fighter.photoKey).catch(() => null) : null
  if (!object?.Body) throw notFoundError('Photo')
  setResponseHeaders(event, {
    'content-type': object.ContentType ?? 'application/octet-stream',
    'cache-control': 'private, max-age=86400',
    'x-content-type-options': 'nosniff',
  })
  return Buffer.from(await object.Body.transformToByteArray())
})
