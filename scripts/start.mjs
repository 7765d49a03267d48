// `npm start`: everything the demo needs, on 127.0.0.1, until Ctrl-C.
import { ensureBuild } from './lib/build.mjs'
import { checkNode, ensureDebianPackages, ensureNodeModules } from './lib/deps.mjs'
import { loadDotEnv, sessionPassword } from './lib/env.mjs'
import { cluster, databaseUrl as localDatabaseUrl } from './lib/postgres.mjs'
import { PROFILES, migrate, seed, seedDemoEvent, startAppAndWorker, startFakes } from './lib/services.mjs'
import { acquireLock, createSupervisor } from './lib/supervisor.mjs'
import { Failure, bold, createTimeline, describeError, dim, fail, info, seconds } from './lib/ui.mjs'

const profile = PROFILES.start
const supervisor = createSupervisor()
const { step, elapsed } = createTimeline()
let exitCode = 0

function guard() {
  if (supervisor.reason) throw new Failure('stopped before start-up finished')
}

const isLoopback = host => host === '127.0.0.1' || host === 'localhost'

function pointsAt(url, port) {
  try {
    const u = new URL(url)
    return isLoopback(u.hostname) && u.port === String(port)
  }
  catch {
    return false
  }
}

/**
 * The app's settings: values from the environment (or .env) win. A fake runs unless the
 * settings point the app at a real service instead.
 */
function configuration(databaseUrl, password) {
  const e = process.env
  const fakes = {
    FAKE_S3_PORT: e.FAKE_S3_PORT || String(profile.s3Port),
    FAKE_S3_DIR: e.FAKE_S3_DIR || profile.s3Dir,
    FAKE_S3_BUCKET: e.FAKE_S3_BUCKET || 'unscathed',
    FAKE_SMTP_PORT: e.FAKE_SMTP_PORT || String(profile.smtpPort),
    FAKE_INBOX_PORT: e.FAKE_INBOX_PORT || String(profile.inboxPort),
  }
  const fakeS3 = !e.NUXT_S3_ENDPOINT || pointsAt(e.NUXT_S3_ENDPOINT, fakes.FAKE_S3_PORT)
  const fakeMail = isLoopback(e.NUXT_MAIL_HOST || '127.0.0.1') && (e.NUXT_MAIL_PORT || fakes.FAKE_SMTP_PORT) === fakes.FAKE_SMTP_PORT
  const port = e.PORT || String(profile.appPort)
  const inboxUrl = `http://127.0.0.1:${fakes.FAKE_INBOX_PORT}`
  const app = {
    HOST: '127.0.0.1',
    PORT: port,
    NUXT_DATABASE_URL: databaseUrl,
    NUXT_SESSION_PASSWORD: password,
    NUXT_APP_URL: e.NUXT_APP_URL || `http://127.0.0.1:${port}`,
    ...(fakeS3 && {
      NUXT_S3_ENDPOINT: `http://127.0.0.1:${fakes.FAKE_S3_PORT}`,
      NUXT_S3_BUCKET: e.NUXT_S3_BUCKET || fakes.FAKE_S3_BUCKET,
      NUXT_S3_ACCESS_KEY_ID: e.NUXT_S3_ACCESS_KEY_ID || 'S3RVER',
      NUXT_S3_SECRET_ACCESS_KEY: e.NUXT_S3_SECRET_ACCESS_KEY || 'S3RVER',
    }),
    ...(fakeMail && {
      NUXT_MAIL_HOST: '127.0.0.1',
      NUXT_MAIL_PORT: fakes.FAKE_SMTP_PORT,
    }),
    NUXT_DEV_INBOX_URL: e.NUXT_DEV_INBOX_URL ?? (fakeMail ? inboxUrl : ''),
    NUXT_PUBLIC_DEV_INBOX: e.NUXT_PUBLIC_DEV_INBOX ?? String(fakeMail),
    // Open live streams would otherwise hold Ctrl-C for Nitro's default 30 s.
    NITRO_SHUTDOWN_TIMEOUT: e.NITRO_SHUTDOWN_TIMEOUT || '3000',
    // The SDK's notice that its 2027 releases need Node 22 is known (STACK.md); once is enough.
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: e.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED || 'true',
    UNSCATHED_PARENT_PID: String(process.pid),
  }
  const names = [fakeS3 && 's3', fakeMail && 'mail'].filter(Boolean)
  return { app, fakes, names, inboxUrl }
}

async function main() {
  checkNode()
  const release = acquireLock('start')
  supervisor.add('lock', release)

  await step('npm packages', record => ensureNodeModules(record))
  guard()
  await step('Debian packages', record => ensureDebianPackages(['start'], record))
  guard()
  loadDotEnv()
  await step('build', record => ensureBuild(record))
  guard()

  let databaseUrl = process.env.NUXT_DATABASE_URL
  if (databaseUrl && databaseUrl !== localDatabaseUrl(profile.pgPort, profile.database)) {
    info('NUXT_DATABASE_URL points elsewhere: using that database, no local PostgreSQL')
  }
  else {
    const pg = cluster({ name: profile.pgName, port: profile.pgPort, database: profile.database })
    supervisor.add('PostgreSQL', () => pg.stop())
    databaseUrl = (await step('PostgreSQL', async (record) => {
      const result = await pg.up()
      if (result.reused) record.status = 'reused'
      return result
    })).url
  }
  guard()
  await step('migrate', record => migrate(databaseUrl, record))
  guard()

  const config = configuration(databaseUrl, sessionPassword())
  const env = { ...process.env, ...config.fakes, ...config.app }
  await step('fakes', async (record) => {
    if (config.names.length === 0) record.status = 'none (real S3 and SMTP)'
    await startFakes(supervisor, config.names, env)
  })
  guard()
  const signIns = await step('seed', record => seed(env, record))
  guard()
  const url = await step('app', () => startAppAndWorker(supervisor, env, Number(process.env.WORKER_PORT || profile.workerPort)))
  guard()
  const eventLines = await step('demo event', () => seedDemoEvent(env, url))
  guard()

  console.log(`\n${bold('Unscathed is running')} ${dim(`(ready in ${seconds(elapsed())})`)}`)
  console.log(`  ${bold(url)}`)
  console.log(`  club site: ${url}/site/saltmarsh-sword-guild`)
  if (config.names.includes('mail')) console.log(`  mail the app sends: ${url}/dev/inbox (signed in as an admin), or ${config.inboxUrl}/messages`)
  if (signIns.length) {
    console.log()
    for (const line of signIns) console.log(`  ${line}`)
  }
  for (const line of eventLines) console.log(`  ${line}`)
  console.log(`\n  ${bold('Ctrl-C stops everything')}\n`)

  const why = await supervisor.ended
  if (why.died) exitCode = 1
}

try {
  await main()
}
catch (error) {
  // After Ctrl-C the interrupted step fails as expected: not worth a message.
  if (!supervisor.reason?.signal) {
    fail(describeError(error))
    exitCode = 1
  }
}
finally {
  await supervisor.stopAll()
}
info(exitCode === 0 ? 'stopped' : 'stopped after a failure')
process.exit(exitCode)
