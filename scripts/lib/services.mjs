import { existsSync } from 'node:fs'
import { SERVER_ENTRY } from './build.mjs'
import { waitForHttp, waitForPort, assertPortFree } from './net.mjs'
import { fromRoot, localBin } from './paths.mjs'
import { run } from './proc.mjs'
import { info, warn } from './ui.mjs'

// UNSCATHED_TEST_PORT_SHIFT moves every test port by the same amount, so that two checkouts on one
// machine can run their tests at the same time.
const shift = Number.parseInt(process.env.UNSCATHED_TEST_PORT_SHIFT ?? '0', 10) || 0

export const PROFILES = {
  start: { pgName: 'pg', pgPort: 54329, database: 'unscathed', appPort: 3000, workerPort: 3050, s3Port: 4568, s3Dir: '.data/s3', smtpPort: 2525, inboxPort: 2580 },
  test: { pgName: 'pg-test', pgPort: 54339 + shift, database: 'unscathed_test', appPort: 3100 + shift, workerPort: 3150 + shift, s3Port: 4578 + shift, s3Dir: '.data/s3-test', smtpPort: 2535 + shift, inboxPort: 2590 + shift },
}

const MIGRATIONS_JOURNAL = 'server/database/migrations/meta/_journal.json'
const SEED = 'server/database/seed/run.ts'
const DEMO_EVENT = 'server/database/seed/demo-event.ts'

export async function migrate(databaseUrl, record) {
  if (!existsSync(fromRoot(MIGRATIONS_JOURNAL))) {
    warn(`no migrations yet (${MIGRATIONS_JOURNAL} is missing): skipped`)
    record.status = 'no migrations'
    return
  }
  await run(localBin('drizzle-kit'), ['migrate'], { env: { ...process.env, NUXT_DATABASE_URL: databaseUrl } })
}

/** Runs the idempotent seed with the app's settings (it uploads to S3); returns the lines it printed. */
export async function seed(env, record) {
  if (!existsSync(fromRoot(SEED))) {
    warn(`no seed yet (${SEED} is missing): skipped`)
    record.status = 'no seed'
    return []
  }
  const { stdout } = await run(localBin('tsx'), [SEED], { env, tee: true })
  return stdout.split('\n').map(line => line.trimEnd()).filter(Boolean)
}

/** Loads the demo event through the running app's API (idempotent); returns the lines it printed. */
export async function seedDemoEvent(env, url) {
  const { stdout } = await run(localBin('tsx'), [DEMO_EVENT], { env: { ...env, DEMO_APP_URL: url }, tee: true })
  return stdout.split('\n').map(line => line.trimEnd()).filter(Boolean)
}

/** Starts `fakes/run.mjs` with the named fakes and waits until each one answers. */
export async function startFakes(supervisor, names, env) {
  if (names.length === 0) return
  if (names.includes('s3')) await assertPortFree(Number(env.FAKE_S3_PORT), 'the fake S3')
  if (names.includes('mail')) {
    await assertPortFree(Number(env.FAKE_SMTP_PORT), 'the fake SMTP server')
    await assertPortFree(Number(env.FAKE_INBOX_PORT), 'the fake inbox')
  }
  const service = supervisor.service('fakes', process.execPath, [fromRoot('fakes', 'run.mjs'), ...names], { env })
  if (names.includes('s3')) await waitForHttp(`http://127.0.0.1:${env.FAKE_S3_PORT}/`, { what: 'the fake S3', timeoutMs: 15_000, service })
  if (names.includes('mail')) {
    await waitForPort(Number(env.FAKE_SMTP_PORT), { what: 'the fake SMTP server', timeoutMs: 15_000, service })
    await waitForHttp(`http://127.0.0.1:${env.FAKE_INBOX_PORT}/messages`, { what: 'the fake inbox', timeoutMs: 15_000, service })
  }
}

/** Starts the built app and waits until GET / answers. `name` tells a worker from the app in messages. */
export async function startApp(supervisor, env, name = 'app') {
  await assertPortFree(Number(env.PORT), `the ${name}`)
  const service = supervisor.service(name, process.execPath, [SERVER_ENTRY], { env })
  const url = `http://127.0.0.1:${env.PORT}`
  const status = await waitForHttp(`${url}/`, { what: `the ${name}`, timeoutMs: 60_000, service })
  if (status >= 500) warn(`the ${name} answers GET / with ${status}`)
  else info(`the ${name} answers GET / with ${status}`)
  return url
}

/**
 * The app as the deployment runs it: a web process for the requests and a worker process
 * beside it for the background work (the live rings' snapshots), both from the same build.
 */
export async function startAppAndWorker(supervisor, env, workerPort) {
  const url = await startApp(supervisor, { ...env, UNSCATHED_ROLE: 'web' })
  await startApp(supervisor, { ...env, PORT: String(workerPort), UNSCATHED_ROLE: 'worker' }, 'worker')
  return url
}
