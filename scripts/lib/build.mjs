import { readdirSync, statSync, utimesSync } from 'node:fs'
import path from 'node:path'
import { fromRoot, localBin } from './paths.mjs'
import { run } from './proc.mjs'
import { info } from './ui.mjs'

export const SERVER_ENTRY = fromRoot('.output', 'server', 'index.mjs')

// Everything that ends up in .output. Directory mtimes count too, so a deleted file triggers a build.
const SOURCES = [
  'pages', 'components', 'layouts', 'middleware', 'composables', 'stores', 'plugins', 'server',
  'shared', 'overlays', 'assets', 'public', 'modules', 'app.vue', 'error.vue', 'app.config.ts',
  'nuxt.config.ts', 'tailwind.config.ts', 'package-lock.json',
]

function newestIn(entry) {
  let stat
  try {
    stat = statSync(entry)
  }
  catch {
    return { ms: 0 }
  }
  let newest = { ms: stat.mtimeMs, file: entry }
  if (!stat.isDirectory()) return newest
  for (const name of readdirSync(entry)) {
    if (name === 'node_modules') continue
    const inner = newestIn(path.join(entry, name))
    if (inner.ms > newest.ms) newest = inner
  }
  return newest
}

/** Why the production build is out of date, or undefined when it is current. */
export function buildStaleReason() {
  let built
  try {
    built = statSync(SERVER_ENTRY).mtimeMs
  }
  catch {
    return '.output/server/index.mjs is missing'
  }
  for (const source of SOURCES) {
    const newest = newestIn(fromRoot(source))
    if (newest.ms > built) return `${path.relative(fromRoot(), newest.file)} changed since the last build`
  }
  return undefined
}

export async function ensureBuild(record) {
  const why = buildStaleReason()
  if (!why) {
    info('.output is up to date')
    record.status = 'up to date'
    return
  }
  info(`${why}: nuxt build`)
  const startedAt = new Date()
  await run(localBin('nuxt'), ['build'])
  // A file saved during the build must still count as newer than the build.
  utimesSync(SERVER_ENTRY, startedAt, startedAt)
}
