import { renderCardBatch } from './cardBatch'
import { cutClip } from './footageClip'
import { probeRecording } from './footageProbe'
import { sendMailing } from './mailing'

// Every background job, registered in one place: its handler and how the queue treats it. A job
// is enqueued from anywhere with `enqueueJob(name, data)` (server/utils/jobs.ts) and runs in a
// worker process (UNSCATHED_ROLE=worker, or a single process with the role `all`), never in a
// web process. Handlers must be safe to run again: a job whose worker died is retried.

export interface JobRun {
  id: string
  /** 0 on the first run. */
  retryCount: number
  /** No retry follows if this run fails. */
  lastAttempt: boolean
}

export interface JobDefinition<Data> {
  handle: (data: Data, job: JobRun) => Promise<void>
  /** Seconds a run may take before the queue takes the job back. */
  expireInSeconds: number
  /** Extra attempts after a failure or an expiry. */
  retryLimit: number
}

const define = <Data>(definition: JobDefinition<Data>) => definition

export const JOBS = {
  // The demo event's 272 cards take under a minute; ten minutes leaves room for large events.
  'cards-batch': define({ handle: renderCardBatch, expireInSeconds: 10 * 60, retryLimit: 2 }),
  // ffprobe reads only the container's index over HTTP: seconds, even for a long recording.
  'footage-probe': define({ handle: probeRecording, expireInSeconds: 5 * 60, retryLimit: 2 }),
  // A 30-minute clip re-encoded exactly takes a few minutes on two cores.
  'footage-clip': define({ handle: cutClip, expireInSeconds: 30 * 60, retryLimit: 1 }),
  // Thousands of readers through a pool of SMTP connections take minutes; a retry skips those already mailed.
  'mailing': define({ handle: sendMailing, expireInSeconds: 30 * 60, retryLimit: 3 }),
}

export type JobName = keyof typeof JOBS
export type JobData<N extends JobName> = Parameters<(typeof JOBS)[N]['handle']>[0]
