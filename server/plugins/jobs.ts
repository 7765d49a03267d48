// Worker processes (UNSCATHED_ROLE=worker, or `all` for one process doing everything) take
// background jobs; web processes only put them on the queue, starting it at the first one.
const RETRY_MS = 5000

export default defineNitroPlugin((nitroApp) => {
  let closed = false
  let timer: ReturnType<typeof setTimeout> | null = null
  nitroApp.hooks.hook('close', async () => {
    closed = true
    if (timer) clearTimeout(timer)
    await stopJobQueue()
  })
  if (process.env.UNSCATHED_JOBS === 'off' || serverRole() === 'web') return
  // The database may come up after the app: keep trying until the queue starts.
  const start = () => startJobWorkers().catch((err: Error) => {
    console.error(`[jobs] could not start the workers, trying again in ${RETRY_MS / 1000} s:`, err.message)
    if (!closed) timer = setTimeout(start, RETRY_MS)
  })
  void start()
})
