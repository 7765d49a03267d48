import { spawn } from 'node:child_process'
import path from 'node:path'
import { setTimeout as delay } from 'node:timers/promises'
import { ROOT } from './paths.mjs'
import { Failure } from './ui.mjs'

const foreground = new Set()

export class CommandFailed extends Failure {
  constructor(command, args, result) {
    const how = result.signal ? `was stopped by ${result.signal}` : `exited with code ${result.code}`
    const shown = [command.replace(path.join(ROOT, 'node_modules', '.bin') + path.sep, ''), ...args].join(' ')
    super(`${shown} ${how}`)
    this.result = result
  }
}

/**
 * Runs a command to completion. Output streams to the console; with `capture` it is
 * collected instead, and with `tee` stdout is both shown and collected.
 */
export function run(command, args = [], options = {}) {
  const { env = process.env, cwd = ROOT, capture = false, tee = false, input, interactive = false, allowFailure = false } = options
  return new Promise((resolve, reject) => {
    const stdin = input !== undefined ? 'pipe' : interactive ? 'inherit' : 'ignore'
    const child = spawn(command, args, {
      cwd,
      env,
      stdio: [stdin, capture || tee ? 'pipe' : 'inherit', capture ? 'pipe' : 'inherit'],
    })
    foreground.add(child)
    let stdout = ''
    let stderr = ''
    child.stdout?.on('data', (chunk) => {
      stdout += chunk
      if (tee) process.stdout.write(chunk)
    })
    child.stderr?.on('data', (chunk) => {
      stderr += chunk
    })
    if (input !== undefined) child.stdin.end(input)
    child.on('error', (error) => {
      foreground.delete(child)
      reject(error.code === 'ENOENT' ? new Failure(`${command}: command not found`) : error)
    })
    child.on('close', (code, signal) => {
      foreground.delete(child)
      const result = { code, signal, stdout, stderr }
      if (code === 0 || allowFailure) resolve(result)
      else reject(new CommandFailed(command, args, result))
    })
  })
}

/** Stops the commands `run` is waiting for, e.g. when Ctrl-C arrives during a build. */
export function stopForeground(signal = 'SIGTERM') {
  for (const child of foreground) child.kill(signal)
}

/**
 * Starts a long-running process in its own process group, so that Ctrl-C in the
 * terminal reaches only our script, which then stops everything in order.
 */
export function startService(name, command, args, { env = process.env, onExit } = {}) {
  const child = spawn(command, args, { cwd: ROOT, env, stdio: ['ignore', 'inherit', 'inherit'], detached: true })
  let markExited
  const exited = new Promise((resolve) => {
    markExited = resolve
  })
  const service = { name, pid: child.pid, running: true, stopping: false, exited }

  child.on('error', (error) => {
    service.running = false
    markExited({ code: null, signal: null, error })
    onExit?.(service, `could not start: ${error.message}`)
  })
  child.on('exit', (code, signal) => {
    service.running = false
    markExited({ code, signal })
    if (!service.stopping) onExit?.(service, signal ? `stopped by ${signal}` : `exited with code ${code}`)
  })

  function signalGroup(sig) {
    try {
      process.kill(-child.pid, sig)
    }
    catch {
      child.kill(sig)
    }
  }

  service.stop = async (graceMs = 5000) => {
    service.stopping = true
    if (!service.running) return
    signalGroup('SIGTERM')
    const outcome = await Promise.race([exited, delay(graceMs).then(() => 'timeout')])
    if (outcome === 'timeout' && service.running) {
      signalGroup('SIGKILL')
      await exited
    }
  }

  return service
}
