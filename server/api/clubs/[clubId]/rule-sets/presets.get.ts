export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, [])
  return { presets: presetNames().map(name => ({ name, settings: presetSettings(name)! })) }
})
