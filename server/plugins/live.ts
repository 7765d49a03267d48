import os from 'node:os'

// Every app process listens to the live bus from the start, so that rings marked out of date get
// their snapshot even before anyone follows them, and closes its clients' streams when it stops.
// A worker process (UNSCATHED_ROLE=worker) makes the snapshots at a lower priority than the app
// processes, which answer the ring desks.
export default defineNitroPlugin((nitroApp) => {
  if (process.env.UNSCATHED_LIVE === 'off') return
  if (serverRole() === 'worker') {
    try {
      os.setPriority(WORKER_NICENESS)
    }
    catch {
      // Not allowed here: the worker runs at normal priority.
    }
    // Its connections give way too (server/utils/db.ts).
  }
  const hub = useLiveHub()
  hub.start().catch((err: Error) => console.error('[live] could not start listening:', err.message))
  nitroApp.hooks.hook('close', () => hub.stop())
})
