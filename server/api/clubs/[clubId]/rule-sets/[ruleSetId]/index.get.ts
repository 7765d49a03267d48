export default defineEventHandler(async (event) => {
  const { clubId, ruleSetId } = validParams(event, ruleSetParams)
  await requireClubRole(event, clubId, [])
  return ruleSetDetail(useDb(), clubId, ruleSetId)
})
