// Every app process listens to the live bus from the start, so that rings marked out of date get
// their snapshot even before anyone follows them, and closes its clients' streams when it stops.
export default defineNitroPlugin((nitroApp) => {
  if (process.env.UNSCATHED_LIVE === 'off') return
  const hub = useLiveHub()
  hub.start().catch((err: Error) => console.error('[live] could not start listening:', err.message))
  nitroApp.hooks.hook('close', () => hub.stop())
})
