// What a benchmark needs, brought up the way the test command does it and stopped after: the
// production build, a fresh PostgreSQL cluster of its own with the migrations, and the app as web
// and worker processes, all on 127.0.0.1 and on ports of their own.
import { randomBytes } from 'node:crypto'
import { ensureBuild } from '../scripts/lib/build.mjs'
import { checkNode, ensureDebianPackages, ensureNodeModules } from '../scripts/lib/deps.mjs'
import { cluster } from '../scripts/lib/postgres.mjs'
import { migrate, startAppAndWorker } from '../scripts/lib/services.mjs'
import { createSupervisor } from '../scripts/lib/supervisor.mjs'

export interface BenchEnvironment {
  appUrl: string
  databaseUrl: string
}

export interface BenchOptions {
  /** Folder name of the cluster under .data/ and its port. */
  name: string
  pgPort: number
  appPort: number
  /** Debian packages the benchmark needs beyond PostgreSQL (e.g. chromium). */
  purposes?: string[]
}

const record = () => ({ status: '' })

/** Brings the environment up, runs `work` in it, and stops everything, also when `work` fails. */
export async function withBenchEnvironment<T>(options: BenchOptions, work: (env: BenchEnvironment) => Promise<T>): Promise<T> {
  checkNode()
  await ensureNodeModules(record())
  await ensureDebianPackages(['test', ...(options.purposes ?? [])], record())
  await ensureBuild(record())
  const supervisor = createSupervisor()
  try {
    const pg = cluster({ name: options.name, port: options.pgPort, database: 'unscathed_bench' })
    supervisor.add('PostgreSQL', () => pg.stop())
    const { url: databaseUrl } = await pg.up({ fresh: true })
    await migrate(databaseUrl, record())
    const base = {
      ...process.env,
      NUXT_DATABASE_URL: databaseUrl,
      NUXT_SESSION_PASSWORD: randomBytes(24).toString('hex'),
      NUXT_APP_URL: `http://127.0.0.1:${options.appPort}`,
      HOST: '127.0.0.1',
      NITRO_SHUTDOWN_TIMEOUT: '3000',
      UNSCATHED_PARENT_PID: String(process.pid),
      AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
    }
    // The deployment DEVELOPERS.md describes: an app process for the requests, a worker beside it.
    const appUrl = await startAppAndWorker(supervisor, { ...base, PORT: String(options.appPort) }, options.appPort + 1)
    return await work({ appUrl, databaseUrl })
  }
  finally {
    await supervisor.stopAll()
  }
}
