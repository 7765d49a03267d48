import os from 'node:os'
import pg from 'pg'
import PgBoss from 'pg-boss'
import { sql } from 'drizzle-orm'
import { JOBS } from '../jobs'
import type { JobData, JobDefinition, JobName } from '../jobs'

// The background job queue: pg-boss on the app's own PostgreSQL (schema `pgboss`, which it makes
// and migrates itself). Every process can enqueue; only worker processes take jobs, and any
// number of them can run at once (pg-boss hands each job to one of them with SKIP LOCKED).

let boss: Promise<PgBoss> | null = null
let working = false

/** This process in the queue's records: host and pid. */
export const WORKER_NAME = `${os.hostname()}:${process.pid}`

// A new job wakes the workers at once through NOTIFY; polling is only the fallback (a missed
// notification, a retry coming due). Polling every half second cost the live bus's tail latency
// on two cores (npm run bench:live: p99 87–130 ms against 31 ms without it).
const POLLING_SECONDS = 10
const WAKE_CHANNEL = 'unscathed_jobs'
let wake: pg.Client | null = null

function startQueue(worker: boolean): Promise<PgBoss> {
  boss ??= (async () => {
    const queue = new PgBoss({
      connectionString: useRuntimeConfig().databaseUrl,
      application_name: `unscathed-jobs-${serverRole()}`,
      max: 4,
      // Archiving, expiry and cron only where jobs run.
      supervise: worker,
      schedule: false,
    })
    queue.on('error', err => console.error('[jobs]', err.message))
    await queue.start()
    for (const [name, job] of Object.entries(JOBS)) {
      // pg-boss 10 wants each queue made before it is used; making it again changes nothing.
      await queue.createQueue(name, { name, retryLimit: job.retryLimit, expireInSeconds: job.expireInSeconds })
    }
    return queue
  })()
  boss.catch(() => {
    boss = null
  })
  return boss
}

/** Puts a job on the queue; a worker process runs it. Answers the job's id. */
export async function enqueueJob<N extends JobName>(name: N, data: JobData<N>): Promise<string> {
  const queue = await startQueue(serverRole() !== 'web')
  const { retryLimit, expireInSeconds } = JOBS[name]
  const id = await queue.send(name, data as object, { retryLimit, expireInSeconds })
  if (!id) throw new Error(`the queue did not take the ${name} job`)
  await useDb().execute(sql`select pg_notify(${WAKE_CHANNEL}, ${name})`)
  return id
}

/** Starts taking jobs of every registered kind, one at a time per kind, in this process. */
export async function startJobWorkers() {
  if (working) return
  working = true
  const queue = await startQueue(true).catch((err) => {
    working = false
    throw err
  })
  const workers = new Map<string, string>()
  // Each entry's handler takes its own kind's data, which is what its queue holds.
  for (const [name, job] of Object.entries(JOBS) as [JobName, JobDefinition<JobData<JobName>>][]) {
    const workerId = await queue.work<JobData<typeof name>>(name, { pollingIntervalSeconds: POLLING_SECONDS, batchSize: 1, includeMetadata: true }, async ([item]) => {
      if (!item) return
      await job.handle(item.data, { id: item.id, retryCount: item.retryCount, lastAttempt: item.retryCount >= job.retryLimit })
    })
    workers.set(name, workerId)
  }
  await listenForJobs(workers)
}

/** Wakes this process's worker of a kind when a job of that kind is sent (from any process). */
async function listenForJobs(workers: Map<string, string>) {
  const client = new pg.Client({ connectionString: useRuntimeConfig().databaseUrl, application_name: `unscathed-jobs-wake-${serverRole()}` })
  client.on('error', (err) => {
    // Polling still finds the jobs; the next start of the queue listens again.
    console.error('[jobs] lost the wake-up connection:', err.message)
    wake = null
  })
  client.on('notification', async (message) => {
    const id = workers.get(message.payload ?? '')
    if (id) (await boss)?.notifyWorker(id)
  })
  await client.connect()
  await client.query(`listen ${WAKE_CHANNEL}`)
  wake = client
}

export async function stopJobQueue() {
  await wake?.end().catch(() => {})
  wake = null
  const queue = await boss?.catch(() => null)
  boss = null
  working = false
  // Jobs under way get a few seconds to finish; what is left is taken back and retried later.
  await queue?.stop({ graceful: true, timeout: 5000, wait: true })
}
