// Breakdown posts for the integration and browser tests: a club's published event with one pool
// fenced, a recording and a ready clip written straight into PostgreSQL (no video is needed to
// embed a clip), and the markup checks for sanitised HTML. All names are invented.
import { Parser } from 'htmlparser2'
import { expect } from 'vitest'
import type { TestClub } from './fixtures'
import { db, schema } from './fixtures'
import type { Client } from './http'
import type { Fixture } from './tournament'
import { drawPools, fenceMatch, makeFixture } from './tournament'

export const FOUR = [
  { name: 'Hedda Crane', clubName: 'Ironquay Fencing Hall' },
  { name: 'Alder Mossley', clubName: 'North Downs Buckler Circle' },
  { name: 'Bryony Tallis', clubName: 'Lanterngate Historical Fencing' },
  { name: 'Cobb Wetherell', clubName: 'Greyfield Sword Society' },
]

export interface PublishedPool {
  fixture: Fixture
  poolNumber: number
  matchId: number
  clipId: number
}

/** A published event with a pool of four whose first match is fenced, and a ready clip of it. */
export async function publishedPool(club: TestClub, organizer: Client): Promise<PublishedPool> {
  const fixture = await makeFixture(club, organizer, { fighters: FOUR, poolSize: 4 })
  const pools = await drawPools(fixture)
  const match = pools[0]!.matches[0]!
  await fenceMatch(fixture, match, match.sideA!.name, 2)
  expect((await organizer.post(`/api/clubs/${club.id}/events/${fixture.eventId}/publish`)).status).toBe(200)
  const clipId = await insertClip(club, fixture.eventId, match.id, 'Crane’s low parry, bout two')
  return { fixture, poolNumber: pools[0]!.number, matchId: match.id, clipId }
}

export async function insertClip(club: TestClub, eventId: number, matchId: number | null, title: string, status: 'ready' | 'queued' = 'ready') {
  const [recording] = await db.insert(schema.recordings).values({
    clubId: club.id, eventId, ringNumber: 1, title: 'Ring 1, morning', fileName: 'ring1.mp4', contentType: 'video/mp4', bytes: 1000,
    objectKey: `recordings/test-${club.id}-${Math.random().toString(36).slice(2)}.mp4`, partSize: 5_242_880, status: 'ready',
  }).returning()
  const [clip] = await db.insert(schema.clips).values({
    clubId: club.id, recordingId: recording!.id, matchId, title, startMs: 1000, endMs: 7000, mode: 'copy', status,
  }).returning()
  return clip!.id
}

const DANGEROUS_TAGS = new Set(['script', 'style', 'object', 'embed', 'frame', 'frameset', 'base', 'meta', 'link', 'input', 'form',
  'body', 'html', 'svg', 'math', 'textarea', 'button', 'xss', 'img2', 'template', 'applet'])

/** Characters a browser drops from a URL before reading its scheme (WHATWG URL: leading C0 controls and spaces, tabs and newlines anywhere). */
const cleanUrl = (value: string) => [...value].filter(c => c.charCodeAt(0) > 0x20).join('').toLowerCase()

/**
 * Everything in `html` that a browser would run: script-like tags, event-handler or style
 * attributes, javascript:/vbscript:/data: URLs, frames other than our player. Parsed by
 * htmlparser2, which decodes character references in attributes as a browser does.
 */
export function activeParts(html: string, ownPlayer: RegExp): string[] {
  const found: string[] = []
  const parser = new Parser({
    onopentag(name, attribs) {
      if (DANGEROUS_TAGS.has(name)) found.push(`<${name}>`)
      for (const [attr, value] of Object.entries(attribs)) {
        if (attr.startsWith('on')) found.push(`${name}[${attr}]`)
        if (attr === 'style') found.push(`${name}[style]`)
        if (['href', 'src', 'action', 'formaction', 'background', 'dynsrc', 'lowsrc', 'data', 'xlink:href'].includes(attr)) {
          const url = cleanUrl(value)
          if (/^(javascript|vbscript|data|livescript):/.test(url)) found.push(`${name}[${attr}=${value}]`)
        }
      }
      if (name === 'iframe' && !ownPlayer.test(attribs.src ?? '')) found.push(`iframe[src=${attribs.src}]`)
    },
  }, { decodeEntities: true, lowerCaseTags: true, lowerCaseAttributeNames: true })
  parser.write(html)
  parser.end()
  return found
}
