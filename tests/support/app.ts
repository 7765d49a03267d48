// A second app process beside the one the test command started, on a port of its own and the
// same database: what two processes behind one load balancer look like. It stops with the tests.
import { spawn } from 'node:child_process'
import type { ChildProcess } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { createServer } from 'node:net'
import { fileURLToPath } from 'node:url'
import { DATABASE_URL } from './fixtures'

const SERVER = fileURLToPath(new URL('../../.output/server/index.mjs', import.meta.url))

/** A port nobody listens on now, to start an app on (and start it again on the same port). */
export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer()
    server.unref()
    server.on('error', reject)
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number }
      server.close(() => resolve(port))
    })
  })
}

export interface SecondApp {
  url: string
  process: ChildProcess
  stop: () => Promise<void>
}

/**
 * Starts the built server again with `env` added, and waits until it answers. On `port` when
 * given (to restart an app where its clients expect it), else on a free one.
 */
export async function startSecondApp(env: Record<string, string> = {}, port?: number): Promise<SecondApp> {
  port ??= await freePort()
  const child = spawn(process.execPath, [SERVER], {
    env: {
      ...process.env,
      NUXT_DATABASE_URL: DATABASE_URL,
      NUXT_SESSION_PASSWORD: process.env.NUXT_SESSION_PASSWORD ?? randomBytes(24).toString('hex'),
      HOST: '127.0.0.1',
      PORT: String(port),
      NITRO_HOST: '127.0.0.1',
      NITRO_PORT: String(port),
      UNSCATHED_PARENT_PID: String(process.pid),
      ...env,
    },
    stdio: ['ignore', 'ignore', 'inherit'],
  })
  const url = `http://127.0.0.1:${port}`
  const deadline = Date.now() + 20_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the second app exited with ${child.exitCode}`)
    try {
      if ((await fetch(url)).ok) break
    }
    catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      child.kill()
      throw new Error('the second app did not answer within 20 s')
    }
    await new Promise(resolve => setTimeout(resolve, 100))
  }
  return {
    url,
    process: child,
    stop: () => new Promise((resolve) => {
      if (child.exitCode !== null) return resolve()
      child.once('exit', () => resolve())
      child.kill('SIGTERM')
    }),
  }
}
