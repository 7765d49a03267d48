import { randomBytes } from 'node:crypto'
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import { parseEnv } from 'node:util'
import { DATA, fromRoot } from './paths.mjs'
import { Failure, info } from './ui.mjs'

/** Reads .env into process.env; variables already set in the environment win. */
export function loadDotEnv() {
  const file = fromRoot('.env')
  if (!existsSync(file)) return
  const values = parseEnv(readFileSync(file, 'utf8'))
  let count = 0
  for (const [key, value] of Object.entries(values)) {
    if (process.env[key] === undefined) {
      process.env[key] = value
      count++
    }
  }
  info(`read ${count} variable${count === 1 ? '' : 's'} from .env`)
}

// nuxt-auth-utils answers 500 on every session route with a password under 32 characters.
const MIN_SESSION_PASSWORD = 32

/** 48 url-safe characters: 36 random bytes in base64url. */
export function randomSessionPassword() {
  return randomBytes(36).toString('base64url')
}

/** NUXT_SESSION_PASSWORD from the environment, else one generated once into .data/session-password. */
export function sessionPassword() {
  const fromEnv = process.env.NUXT_SESSION_PASSWORD
  if (fromEnv !== undefined && fromEnv !== '') {
    if (fromEnv.length < MIN_SESSION_PASSWORD) throw new Failure(`NUXT_SESSION_PASSWORD must be at least ${MIN_SESSION_PASSWORD} characters`)
    return fromEnv
  }
  const file = path.join(DATA, 'session-password')
  if (existsSync(file)) {
    const saved = readFileSync(file, 'utf8').trim()
    if (saved.length >= MIN_SESSION_PASSWORD) return saved
  }
  mkdirSync(DATA, { recursive: true })
  const password = randomSessionPassword()
  writeFileSync(file, `${password}\n`, { mode: 0o600 })
  chmodSync(file, 0o600)
  info('generated a session password into .data/session-password')
  return password
}
