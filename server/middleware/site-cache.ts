// The club site's pages from memory (server/utils/siteCache.ts); everything else passes through.
export default defineEventHandler(async (event) => {
  const answer = await siteCacheAnswer(event)
  if (answer !== undefined) return answer
})
