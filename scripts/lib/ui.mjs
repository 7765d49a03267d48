import { performance } from 'node:perf_hooks'

const colour = process.stdout.isTTY && !process.env.NO_COLOR
const paint = code => text => colour ? `\u001B[${code}m${text}\u001B[0m` : String(text)

export const bold = paint('1')
export const dim = paint('2')
export const red = paint('31')
export const green = paint('32')
export const yellow = paint('33')
export const cyan = paint('36')

export function info(message) {
  console.log(`${cyan('›')} ${message}`)
}

export function warn(message) {
  console.warn(`${yellow('!')} ${message}`)
}

export function fail(message) {
  console.error(`${red('✗')} ${message}`)
}

export function seconds(ms) {
  return ms < 1000 ? `${Math.round(ms)} ms` : `${(ms / 1000).toFixed(1)} s`
}

/** A failure whose message is the whole story: printed without a stack. */
export class Failure extends Error {
  name = 'Failure'
}

export function describeError(error) {
  if (error instanceof Failure) return error.message
  return error?.stack ?? String(error)
}

/**
 * Runs named steps, prints a header before and the elapsed time after each one,
 * and keeps the results for a summary.
 */
export function createTimeline() {
  const started = performance.now()
  const steps = []

  async function step(name, work) {
    console.log(`\n${bold(`▸ ${name}`)}`)
    const record = { name, status: 'running', ms: 0 }
    steps.push(record)
    const t0 = performance.now()
    try {
      const value = await work(record)
      if (record.status === 'running') record.status = 'ok'
      return value
    }
    catch (error) {
      record.status = 'failed'
      throw error
    }
    finally {
      record.ms = performance.now() - t0
      const mark = record.status === 'failed' ? red('✗') : record.status === 'ok' ? green('✓') : yellow('–')
      console.log(`${mark} ${name} ${dim(`${record.status === 'ok' ? '' : `${record.status}, `}${seconds(record.ms)}`)}`)
    }
  }

  function skip(name, reason) {
    steps.push({ name, status: reason, ms: 0 })
  }

  function summary(title) {
    const width = Math.max(...steps.map(s => s.name.length), 4)
    console.log(`\n${bold(title)}`)
    for (const s of steps) {
      const status = s.status === 'ok' ? green('ok') : s.status === 'failed' ? red('FAILED') : yellow(s.status)
      console.log(`  ${s.name.padEnd(width)}  ${s.ms ? seconds(s.ms).padStart(8) : ''.padStart(8)}  ${status}`)
    }
    console.log(`  ${'total'.padEnd(width)}  ${seconds(performance.now() - started).padStart(8)}`)
  }

  return { step, skip, summary, steps, elapsed: () => performance.now() - started }
}
