export default defineEventHandler(async (event) => {
  const { clubId } = validParams(event, clubParams)
  await requireClubRole(event, clubId, MARK_KIND_ROLES)
  return markKindsView(useDb(), clubId)
})
