// Worker processes look for breakdown posts that became public (published now, or a scheduled
// time that passed) and queue their mailing to the club's readers. Several workers may look at
// once: the claim is one UPDATE, so each post is announced by exactly one of them.

export default defineNitroPlugin((nitroApp) => {
  if (process.env.UNSCATHED_JOBS === 'off' || serverRole() === 'web') return
  const seconds = Math.max(1, Number(useRuntimeConfig().announceSeconds) || 15)
  let busy = false
  const tick = async () => {
    if (busy) return
    busy = true
    try {
      await announceNewPosts()
    }
    catch (err) {
      // The database or the queue may not be up yet: the next round tries again.
      console.error('[announce]', (err as Error).message)
    }
    finally {
      busy = false
    }
  }
  const timer = setInterval(tick, seconds * 1000)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
