import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import { DATA } from './paths.mjs'
import { startService, stopForeground } from './proc.mjs'
import { Failure, describeError, fail, info, warn } from './ui.mjs'

/**
 * Keeps what a script started, stops it in reverse order, and turns Ctrl-C,
 * SIGTERM or the unexpected death of a service into one `ended` promise.
 */
export function createSupervisor() {
  const started = []
  let reason
  let stopping = false
  let resolveEnded
  const ended = new Promise((resolve) => {
    resolveEnded = resolve
  })

  function end(why) {
    if (reason) return
    reason = why
    resolveEnded(why)
    stopForeground()
  }

  let firstSignalAt = 0
  function onSignal(signal) {
    if (stopping || reason) {
      // npm passes the terminal's Ctrl-C on as well, so one keypress arrives twice.
      if (Date.now() - firstSignalAt > 1000) warn('already stopping, one moment')
      return
    }
    firstSignalAt = Date.now()
    console.log()
    info(`${signal} received, stopping`)
    end({ signal })
  }
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, onSignal)

  function add(name, stop) {
    started.push({ name, stop })
  }

  function service(name, command, args, options = {}) {
    const svc = startService(name, command, args, {
      ...options,
      onExit(_svc, how) {
        fail(`${name} ${how}`)
        end({ died: name })
      },
    })
    add(name, () => svc.stop())
    return svc
  }

  async function stopAll() {
    stopping = true
    while (started.length) {
      const { name, stop } = started.pop()
      try {
        info(`stopping ${name}`)
        await stop()
      }
      catch (error) {
        fail(`could not stop ${name}: ${describeError(error)}`)
      }
    }
  }

  return {
    add,
    service,
    stopAll,
    end,
    ended,
    get reason() {
      return reason
    },
  }
}

function isAlive(pid) {
  try {
    process.kill(pid, 0)
    return true
  }
  catch (error) {
    return error.code === 'EPERM'
  }
}

function commandLine(pid) {
  try {
    return readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').join(' ')
  }
  catch {
    return ''
  }
}

/** Whether `scripts/<name>.mjs` is running in another process, by its pid file. */
export function lockHolder(name) {
  const file = path.join(DATA, `${name}.pid`)
  if (!existsSync(file)) return undefined
  const pid = Number(readFileSync(file, 'utf8').trim())
  if (!Number.isInteger(pid) || pid === process.pid || !isAlive(pid)) return undefined
  const cmd = commandLine(pid)
  // Without /proc we cannot tell a reused pid from ours, so trust the file.
  if (cmd && !cmd.includes(`${name}.mjs`)) return undefined
  return pid
}

/** One `npm start` (or `npm test`) at a time: they share ports and data folders. */
export function acquireLock(name) {
  const holder = lockHolder(name)
  if (holder) throw new Failure(`npm ${name} is already running (pid ${holder}); stop it first`)
  mkdirSync(DATA, { recursive: true })
  const file = path.join(DATA, `${name}.pid`)
  writeFileSync(file, `${process.pid}\n`)
  return () => {
    if (lockHolder(name) === undefined) rmSync(file, { force: true })
  }
}
