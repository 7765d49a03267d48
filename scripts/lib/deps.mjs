import { existsSync, readdirSync, statSync } from 'node:fs'
import path from 'node:path'
import { fromRoot } from './paths.mjs'
import { run } from './proc.mjs'
import { Failure, info } from './ui.mjs'

/**
 * Debian packages the scripts install when missing. `file` proves a package is present
 * (`*` matches one path segment); `for` says who needs it: `start`, `test` (the test
 * environment) or `e2e` (the browser tests).
 */
export const DEBIAN_PACKAGES = [
  { name: 'postgresql', file: '/usr/lib/postgresql/*/bin/initdb', for: ['start', 'test'] },
  { name: 'chromium', file: '/usr/bin/chromium', for: ['e2e'] },
  // Footage: probing uploads, cutting clips and their poster frames.
  { name: 'ffmpeg', file: '/usr/bin/ffprobe', for: ['start', 'test'] },
]

const MIN_NODE = [20, 19]

export function checkNode() {
  const [major, minor] = process.versions.node.split('.').map(Number)
  if (major < MIN_NODE[0] || (major === MIN_NODE[0] && minor < MIN_NODE[1])) {
    throw new Failure(`Node ${MIN_NODE.join('.')} or newer is needed; this is ${process.versions.node}`)
  }
}

/** Paths matching a pattern whose `*` stands for one path segment. */
export function globFiles(pattern) {
  let found = ['/']
  for (const segment of pattern.split('/').filter(Boolean)) {
    const next = []
    for (const dir of found) {
      if (!segment.includes('*')) {
        const candidate = path.join(dir, segment)
        if (existsSync(candidate)) next.push(candidate)
        continue
      }
      const re = new RegExp(`^${segment.split('*').map(part => part.replace(/[.+?^${}()|[\]\\]/g, '\\$&')).join('[^/]*')}$`)
      let names
      try {
        names = readdirSync(dir)
      }
      catch {
        continue
      }
      for (const name of names) if (re.test(name)) next.push(path.join(dir, name))
    }
    found = next
  }
  return found
}

function mtime(file) {
  try {
    return statSync(file).mtimeMs
  }
  catch {
    return undefined
  }
}

/** Why `npm ci` must run, or undefined when node_modules matches package-lock.json. */
export function nodeModulesStaleReason() {
  const installed = mtime(fromRoot('node_modules', '.package-lock.json'))
  if (installed === undefined) return 'node_modules is missing'
  const lock = mtime(fromRoot('package-lock.json'))
  if (lock !== undefined && lock > installed) return 'package-lock.json is newer than node_modules'
  return undefined
}

export async function ensureNodeModules(record) {
  const why = nodeModulesStaleReason()
  if (!why) {
    info('node_modules is up to date')
    record.status = 'up to date'
    return
  }
  info(`${why}: npm ci --engine-strict`)
  await run('npm', ['ci', '--engine-strict'])
}

function isRoot() {
  return process.getuid?.() === 0
}

function onPath(command) {
  return (process.env.PATH ?? '').split(path.delimiter).some(dir => dir && existsSync(path.join(dir, command)))
}

const neededFor = purposes => DEBIAN_PACKAGES.filter(p => p.for.some(use => purposes.includes(use)))

export function missingDebianPackages(purposes) {
  return neededFor(purposes).filter(p => globFiles(p.file).length === 0)
}

export async function ensureDebianPackages(purposes, record) {
  const missing = missingDebianPackages(purposes).map(p => p.name)
  if (missing.length === 0) {
    info(`present: ${neededFor(purposes).map(p => p.name).join(', ') || 'nothing needed'}`)
    record.status = 'up to date'
    return
  }
  if (!onPath('apt-get')) {
    throw new Failure(`missing ${missing.join(', ')}, and apt-get is not available: install them with your system's package manager`)
  }
  let prefix = []
  if (!isRoot()) {
    if (!onPath('sudo')) {
      throw new Failure(`missing Debian packages ${missing.join(', ')}: run \`apt-get install -y ${missing.join(' ')}\` as root, or install sudo`)
    }
    prefix = ['sudo', '--preserve-env=DEBIAN_FRONTEND']
  }
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
  const apt = (...args) => {
    const argv = [...prefix, 'apt-get', '-o', 'DPkg::Lock::Timeout=120', ...args]
    return run(argv[0], argv.slice(1), { env, interactive: true })
  }
  info(`installing ${missing.join(', ')}`)
  await apt('update')
  await apt('install', '-y', ...missing)
  const still = missingDebianPackages(purposes).map(p => p.name)
  if (still.length) throw new Failure(`apt-get finished but ${still.join(', ')} still look missing`)
}
