// `npm test`: lint, typecheck, unit tests, then integration and browser tests against the
// built app, a fresh PostgreSQL cluster and the fakes, all on ports of their own.
import { readdirSync, rmSync } from 'node:fs'
import path from 'node:path'
import { parseArgs } from 'node:util'
import { buildStaleReason, ensureBuild } from './lib/build.mjs'
import { checkNode, ensureDebianPackages, ensureNodeModules } from './lib/deps.mjs'
import { randomSessionPassword } from './lib/env.mjs'
import { fromRoot, localBin } from './lib/paths.mjs'
import { cluster } from './lib/postgres.mjs'
import { run } from './lib/proc.mjs'
import { PROFILES, migrate, seed, seedDemoEvent, startAppAndWorker, startFakes } from './lib/services.mjs'
import { acquireLock, createSupervisor, lockHolder } from './lib/supervisor.mjs'
import { bold, createTimeline, describeError, dim, fail, info, warn } from './lib/ui.mjs'

const CHECKS = {
  lint: { dir: null, command: ['eslint', ['.']] },
  typecheck: { dir: null, command: ['nuxt', ['typecheck']] },
  unit: { dir: 'tests/unit', pattern: /\.test\.ts$/, command: ['vitest', ['run', '--project', 'unit']] },
  integration: { dir: 'tests/integration', pattern: /\.test\.ts$/, env: true, command: ['vitest', ['run', '--project', 'integration']] },
  e2e: { dir: 'tests/e2e', pattern: /\.(spec|test)\.ts$/, env: true, command: ['playwright', ['test']] },
}
const NAMES = Object.keys(CHECKS)

const USAGE = `npm test [-- options]

  --only <steps>   run only these steps, comma-separated: ${NAMES.join(', ')}
                   (env = just bring the test environment up)
  --skip <steps>   run all steps but these
  --bail           stop at the first failing step
  --hold           keep the test environment running after the steps, until Ctrl-C
  --help           this text

Integration and e2e bring up the environment first: build, a fresh PostgreSQL,
migrations, the fakes, the seed and the app.`

function parseSteps(list) {
  const names = list.flatMap(item => item.split(',')).map(s => s.trim()).filter(Boolean)
  const unknown = names.filter(n => n !== 'env' && !NAMES.includes(n))
  if (unknown.length) {
    console.error(`unknown step: ${unknown.join(', ')}\n\n${USAGE}`)
    process.exit(2)
  }
  return names
}

function options() {
  let parsed
  try {
    parsed = parseArgs({
      options: {
        only: { type: 'string', multiple: true },
        skip: { type: 'string', multiple: true },
        bail: { type: 'boolean' },
        hold: { type: 'boolean' },
        help: { type: 'boolean', short: 'h' },
      },
    }).values
  }
  catch (error) {
    console.error(`${error.message}\n\n${USAGE}`)
    process.exit(2)
  }
  if (parsed.help) {
    console.log(USAGE)
    process.exit(0)
  }
  const only = parsed.only ? parseSteps(parsed.only) : undefined
  const skip = parsed.skip ? parseSteps(parsed.skip) : []
  const selected = new Set(NAMES.filter(n => (!only || only.includes(n)) && !skip.includes(n)))
  const wantsEnv = Boolean(parsed.hold) || Boolean(only?.includes('env')) || [...selected].some(n => CHECKS[n].env)
  return { selected, wantsEnv, bail: Boolean(parsed.bail), hold: Boolean(parsed.hold) }
}

function hasTests(dir, pattern) {
  const walk = (d) => {
    let entries
    try {
      entries = readdirSync(d, { withFileTypes: true })
    }
    catch {
      return false
    }
    return entries.some(e => e.isDirectory() ? walk(path.join(d, e.name)) : pattern.test(e.name))
  }
  return walk(fromRoot(dir))
}

// Tests must not pick up settings meant for `npm start` or for production.
function cleanEnvironment() {
  return Object.fromEntries(Object.entries(process.env).filter(([key]) => !/^(NUXT_|FAKE_|NITRO_)/.test(key)))
}

function testConfiguration(databaseUrl) {
  const p = PROFILES.test
  const appUrl = `http://127.0.0.1:${p.appPort}`
  const inboxUrl = `http://127.0.0.1:${p.inboxPort}`
  const s3Url = `http://127.0.0.1:${p.s3Port}`
  const nuxt = {
    NUXT_DATABASE_URL: databaseUrl,
    NUXT_SESSION_PASSWORD: randomSessionPassword(),
    NUXT_APP_URL: appUrl,
    // The tests wait for posts to be mailed: look every second rather than every 15.
    NUXT_ANNOUNCE_SECONDS: '1',
    NUXT_S3_ENDPOINT: s3Url,
    NUXT_S3_REGION: 'us-east-1',
    NUXT_S3_BUCKET: 'unscathed',
    NUXT_S3_ACCESS_KEY_ID: 'S3RVER',
    NUXT_S3_SECRET_ACCESS_KEY: 'S3RVER',
    NUXT_S3_FORCE_PATH_STYLE: 'true',
    NUXT_MAIL_HOST: '127.0.0.1',
    NUXT_MAIL_PORT: String(p.smtpPort),
    NUXT_DEV_INBOX_URL: inboxUrl,
    NUXT_PUBLIC_DEV_INBOX: 'true',
  }
  const fakes = {
    FAKE_S3_PORT: String(p.s3Port),
    FAKE_S3_DIR: p.s3Dir,
    FAKE_S3_BUCKET: 'unscathed',
    FAKE_SMTP_PORT: String(p.smtpPort),
    FAKE_INBOX_PORT: String(p.inboxPort),
  }
  // The SDK's notice that its 2027 releases need Node 22 is known (STACK.md), not a test result.
  const base = { ...cleanEnvironment(), AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true' }
  return {
    fakes: { ...base, ...fakes, UNSCATHED_PARENT_PID: String(process.pid) },
    app: {
      ...base,
      ...nuxt,
      HOST: '127.0.0.1',
      PORT: String(p.appPort),
      NITRO_SHUTDOWN_TIMEOUT: '3000',
      UNSCATHED_PARENT_PID: String(process.pid),
    },
    // vitest overwrites BASE_URL with Vite's base path, hence TEST_APP_URL for the integration tests.
    tests: { ...base, ...nuxt, BASE_URL: appUrl, TEST_APP_URL: appUrl, FAKE_INBOX_URL: inboxUrl, FAKE_S3_ENDPOINT: s3Url },
  }
}

const opts = options()
const supervisor = createSupervisor()
const timeline = createTimeline()
let failed = false
let held = false
let testEnv = cleanEnvironment()

async function attempt(name, work) {
  if (supervisor.reason || (opts.bail && failed)) {
    timeline.skip(name, 'not run')
    return false
  }
  try {
    await timeline.step(name, work)
    return true
  }
  catch (error) {
    // A step cut short by Ctrl-C did not fail: the run was interrupted.
    if (!supervisor.reason?.signal) {
      failed = true
      fail(describeError(error))
    }
    return false
  }
}

async function check(name) {
  const { dir, pattern, command: [bin, args] } = CHECKS[name]
  if (!opts.selected.has(name)) {
    timeline.skip(name, 'skipped')
    return
  }
  await attempt(name, async (record) => {
    if (dir && !hasTests(dir, pattern)) {
      warn(`no tests in ${dir} yet`)
      record.status = 'no tests'
      return
    }
    info(dim(`${bin} ${args.join(' ')}`))
    await run(localBin(bin), args, { env: testEnv })
  })
}

async function environment() {
  const holder = lockHolder('start')
  if (holder && buildStaleReason()) {
    warn(`npm start is running (pid ${holder}) and the build is stale: rebuilding replaces the files its app serves; restart it afterwards`)
  }
  if (!(await attempt('build', record => ensureBuild(record)))) return false

  const p = PROFILES.test
  const pg = cluster({ name: p.pgName, port: p.pgPort, database: p.database })
  supervisor.add('PostgreSQL', () => pg.stop())
  let databaseUrl
  if (!(await attempt('PostgreSQL', async () => {
    databaseUrl = (await pg.up({ fresh: true })).url
  }))) return false

  const config = testConfiguration(databaseUrl)
  if (!(await attempt('migrate', record => migrate(databaseUrl, record)))) return false
  if (!(await attempt('fakes', async () => {
    rmSync(path.resolve(fromRoot(), p.s3Dir), { recursive: true, force: true })
    await startFakes(supervisor, ['s3', 'mail'], config.fakes)
  }))) return false
  if (!(await attempt('seed', record => seed(config.app, record)))) return false
  if (!(await attempt('app', () => startAppAndWorker(supervisor, config.app, p.workerPort)))) return false
  // The browser tests check the demo event's public pages, so the test database gets it too.
  if (!(await attempt('demo event', () => seedDemoEvent(config.app, `http://127.0.0.1:${p.appPort}`)))) return false
  testEnv = config.tests
  return true
}

async function main() {
  checkNode()
  supervisor.add('lock', acquireLock('test'))
  if (!(await attempt('npm packages', record => ensureNodeModules(record)))) return
  const purposes = opts.wantsEnv ? ['test', ...(opts.selected.has('e2e') ? ['e2e'] : [])] : []
  if (purposes.length && !(await attempt('Debian packages', record => ensureDebianPackages(purposes, record)))) return

  await check('lint')
  await check('typecheck')
  await check('unit')

  const ready = opts.wantsEnv && !(opts.bail && failed) && !supervisor.reason && await environment()
  for (const name of ['integration', 'e2e']) {
    if (ready || !opts.selected.has(name)) await check(name)
    else timeline.skip(name, 'not run')
  }

  if (opts.hold && ready && !supervisor.reason) {
    console.log(`\n${bold('The test environment is up.')} For tests run by hand, in another shell:`)
    for (const key of ['TEST_APP_URL', 'BASE_URL', 'NUXT_DATABASE_URL', 'FAKE_INBOX_URL', 'FAKE_S3_ENDPOINT']) {
      console.log(`  export ${key}=${testEnv[key]}`)
    }
    console.log(`\n  ${bold('Ctrl-C stops it')}\n`)
    held = true
    await supervisor.ended
  }
}

try {
  await main()
}
catch (error) {
  failed = true
  fail(describeError(error))
}
finally {
  await supervisor.stopAll()
}
if (supervisor.reason?.died) failed = true
const interrupted = Boolean(supervisor.reason?.signal) && !held
timeline.summary(failed ? 'npm test failed' : interrupted ? 'npm test interrupted' : 'npm test passed')
process.exit(failed ? 1 : interrupted ? 130 : 0)
