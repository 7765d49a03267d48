// Used by the fakes and the app, so a crashed or killed `npm start` leaves nothing behind.

function isAlive(pid) {
  try {
    process.kill(pid, 0)
    return true
  }
  catch (error) {
    return error.code === 'EPERM'
  }
}

/**
 * Calls `onGone` once the process named by UNSCATHED_PARENT_PID has gone. When that
 * process is our direct parent, being re-parented also counts, in case the pid is reused.
 */
export function watchParent(onGone, intervalMs = 2000) {
  const pid = Number(process.env.UNSCATHED_PARENT_PID)
  if (!Number.isInteger(pid) || pid <= 1) return
  const direct = process.ppid === pid
  const timer = setInterval(() => {
    if (isAlive(pid) && (!direct || process.ppid === pid)) return
    clearInterval(timer)
    onGone()
  }, intervalMs)
  timer.unref()
}

/** Runs `close` and exits on SIGINT, SIGTERM or when the parent goes away. */
export function stopOnSignals(close) {
  let closing = false
  const stop = async (why) => {
    if (closing) return
    closing = true
    const force = setTimeout(() => process.exit(1), 5000)
    force.unref()
    try {
      await close(why)
      process.exit(0)
    }
    catch (error) {
      console.error(error)
      process.exit(1)
    }
  }
  process.on('SIGINT', () => stop('SIGINT'))
  process.on('SIGTERM', () => stop('SIGTERM'))
  watchParent(() => stop('parent gone'))
}
