import { createHash, randomBytes } from 'node:crypto'

/** A URL-safe random token (256 bits) and the hash that is stored in its place. */
export function newToken(): { token: string, hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashToken(token) }
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

export const INVITATION_TTL_MS = 7 * 24 * 3600 * 1000
export const RESET_TTL_MS = 60 * 60 * 1000
export const MAX_RESETS_PER_WINDOW = 3
