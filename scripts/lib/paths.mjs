import { fileURLToPath } from 'node:url'
import path from 'node:path'

export const ROOT = path.resolve(fileURLToPath(new URL('../..', import.meta.url)))
export const DATA = path.join(ROOT, '.data')

export const fromRoot = (...parts) => path.join(ROOT, ...parts)

/** A value from the environment or a default, resolved against the repository root. */
export function rootPath(value, fallback) {
  return path.resolve(ROOT, value || fallback)
}

/** The executable npm placed in node_modules/.bin; same resolution as `npx <name>` without the npx start-up cost. */
export function localBin(name) {
  return path.join(ROOT, 'node_modules', '.bin', name)
}
