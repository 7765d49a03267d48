// Loads the demo event, the Wrenmouth Harvest Open, through the app's own API as the demo
// organizer would: rule sets, the event, two tournaments, entries by CSV, check-in, pools and
// results. Run after the app is up; safe to run again (an existing event is left as it is).
import { execFile } from 'node:child_process'
import { mkdtemp, readFile, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { promisify } from 'node:util'
import type { MatchEntry, Side } from '../../../shared/rules'
import { randomFromKey } from '../../../shared/utils/random'

const APP = process.env.DEMO_APP_URL ?? 'http://127.0.0.1:3000'
const ORGANIZER = { email: 'organizer@saltmarsh.example', password: 'saltmarsh-organizer' }
const COMMENTATOR = { email: 'commentary@saltmarsh.example', password: 'saltmarsh-commentary' }
const EVENT_SLUG = 'wrenmouth-harvest-open'

// Invented fighters of invented clubs (the demo scenario); the number is a hidden skill that
// makes the generated results look like a real day rather than coin tosses.
const FIGHTERS: [name: string, club: string, skill: number][] = [
  ['Maren Holt', 'Saltmarsh Sword Guild', 0.7], ['Corin Vale', 'Saltmarsh Sword Guild', 0.55],
  ['Edda Brine', 'Saltmarsh Sword Guild', 0.45], ['Tam Ostrey', 'Saltmarsh Sword Guild', 0.35],
  ['Elias Corran', 'Ironquay Fencing Hall', 0.8], ['Hester Quill', 'Ironquay Fencing Hall', 0.6],
  ['Bram Tolley', 'Ironquay Fencing Hall', 0.4], ['Nia Farrow', 'Ironquay Fencing Hall', 0.5],
  ['Oswin Hale', 'North Downs Buckler Circle', 0.65], ['Rosalind Pike', 'North Downs Buckler Circle', 0.5],
  ['Gideon Marsh', 'North Downs Buckler Circle', 0.3], ['Lark Endicott', 'North Downs Buckler Circle', 0.55],
  ['Tilda Greaves', 'Lanterngate Historical Fencing', 0.75], ['Rowan Ashby', 'Lanterngate Historical Fencing', 0.45],
  ['Idris Penhallow', 'Lanterngate Historical Fencing', 0.6], ['Wynne Carrow', 'Lanterngate Historical Fencing', 0.35],
  ['Sable Dunmore', 'Greyfield Sword Society', 0.5], ['Fenwick Rhys', 'Greyfield Sword Society', 0.65],
  ['Orla Stannard', 'Greyfield Sword Society', 0.4], ['Piers Aldous', 'Greyfield Sword Society', 0.55],
  ['Juno Harrow', 'Old Mill Fencing School', 0.7], ['Caspar Wick', 'Old Mill Fencing School', 0.45],
  ['Morwen Teague', 'Old Mill Fencing School', 0.5], ['Alder Finch', 'Old Mill Fencing School', 0.3],
  ['Brisa Calloway', 'Ironquay Fencing Hall', 0.45], ['Ned Harcourt', 'North Downs Buckler Circle', 0.6],
  ['Perrin Lowe', 'Greyfield Sword Society', 0.35], ['Selka Varn', 'Old Mill Fencing School', 0.6],
  ['Hollis Brack', 'Lanterngate Historical Fencing', 0.5], ['Ivy Tremayne', 'Saltmarsh Sword Guild', 0.5],
]
const SWORD_AND_BUCKLER = FIGHTERS.slice(0, 18)
const LONGSWORD = FIGHTERS.slice(12, 30)

let cookie = ''
async function api<T>(method: string, path: string, body?: unknown): Promise<T> {
  const res = await fetch(new URL(path, APP), {
    method,
    headers: { 'content-type': 'application/json', 'accept': 'application/json', ...(cookie ? { cookie } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  })
  const set = res.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))
  if (set) cookie = set.split(';')[0]!
  const text = await res.text()
  if (!res.ok) throw new Error(`${method} ${path} answered ${res.status}: ${text}`)
  return (text ? JSON.parse(text) : null) as T
}

const skillOf = new Map(FIGHTERS.map(([name, , skill]) => [name, skill]))
const TARGETS = ['head', 'torso', 'torso', 'arms', 'arms', 'hands', 'legs'] as const

function hitFrom(next: () => number) {
  return { target: TARGETS[Math.floor(next() * TARGETS.length)]!, action: next() < 0.6 ? 'cut' as const : 'thrust' as const }
}

/** One bout or exchange between fighters of the given skills, as the table would record it. */
function exchange(next: () => number, skillA: number, skillB: number, id: string): MatchEntry {
  const roll = next()
  if (roll < 0.05) return { kind: 'void', id, reason: next() < 0.5 ? 'not-seen' : 'no-valid-hit' }
  if (roll < 0.15) return { kind: 'double', id, a: hitFrom(next), b: hitFrom(next) }
  const side: Side = next() < skillA / (skillA + skillB) ? 'a' : 'b'
  if (roll < 0.3) return { kind: 'afterblow', id, side, ...hitFrom(next), afterblow: hitFrom(next) }
  return { kind: 'clean', id, side, ...hitFrom(next) }
}

interface MatchSummary { id: number, poolId: number | null, status: string, version: number, sideA: { name: string } | null, sideB: { name: string } | null }
interface MatchDetail { match: MatchSummary, state: { finished: boolean } }

async function fight(base: string, match: MatchSummary, format: 'first-hit' | 'points') {
  const next = randomFromKey(`demo-${match.id}`)
  const skillA = skillOf.get(match.sideA!.name) ?? 0.5
  const skillB = skillOf.get(match.sideB!.name) ?? 0.5
  let version = match.version
  // A points match that nobody has won after twelve exchanges runs out of time.
  const limit = format === 'points' ? 12 : 40
  for (let i = 0; i <= limit; i++) {
    const entry: MatchEntry = i === limit ? { kind: 'time-up', id: `demo-${match.id}-time` } : exchange(next, skillA, skillB, `demo-${match.id}-${i}`)
    const res = await api<MatchDetail>('POST', `${base}/matches/${match.id}/entries`, { expectedVersion: version, entries: [entry] })
    version = res.match.version
    if (res.state.finished) return
  }
}

async function main() {
  await api('POST', '/api/auth/sign-in', ORGANIZER)
  const account = await api<{ clubs: { id: number, slug: string }[] }>('GET', '/api/account')
  const club = account.clubs.find(c => c.slug === 'saltmarsh-sword-guild')
  if (!club) throw new Error('the demo club is missing: run the demo seed first')
  const clubApi = `/api/clubs/${club.id}`
  const { events } = await api<{ events: { slug: string }[] }>('GET', `${clubApi}/events`)
  if (events.some(e => e.slug === EVENT_SLUG)) {
    console.log('demo event: already loaded, nothing changed')
    return
  }

  const sb = await api<{ id: number }>('POST', `${clubApi}/rule-sets`, { name: 'Harvest Open: sword and buckler', preset: 'first-hit-three-bouts' })
  const ls = await api<{ id: number }>('POST', `${clubApi}/rule-sets`, { name: 'Harvest Open: longsword', preset: 'points-to-seven' })
  const event = await api<{ id: number }>('POST', `${clubApi}/events`, {
    name: 'Wrenmouth Harvest Open', slug: EVENT_SLUG, startsOn: '2026-10-10', endsOn: '2026-10-10',
    venue: 'The Net Loft, Harbour Row, Wrenmouth', rings: 3,
    emergencyNumber: '112', firstAidPoint: 'Beside ring 1, at the harbour door',
  })
  const eventApi = `${clubApi}/events/${event.id}`
  // The desk stamps each entry with the server's time: the demo footage starts a little before.
  const fencingFrom = Date.now()

  const plan = [
    { name: 'Sword and buckler', weapon: 'sword and buckler', ruleSetId: sb.id, fighters: SWORD_AND_BUCKLER, format: 'first-hit' as const, share: 1 },
    { name: 'Longsword', weapon: 'longsword', ruleSetId: ls.id, fighters: LONGSWORD, format: 'points' as const, share: 0.5 },
  ]
  for (const t of plan) {
    const tournament = await api<{ id: number }>('POST', `${eventApi}/tournaments`, {
      name: t.name, weapon: t.weapon, ruleSetId: t.ruleSetId, poolSize: 6, qualifyCount: 4,
    })
    const base = `${eventApi}/tournaments/${tournament.id}`
    const csv = ['name,club,seed', ...t.fighters.map(([name, clubName], i) => `${name},${clubName},${i < 6 ? i + 1 : ''}`)].join('\n')
    await api('POST', `${base}/entries/import`, { csv, dryRun: false })
    const { entries } = await api<{ entries: { id: number }[] }>('GET', `${base}/entries`)
    for (const entry of entries) await api('POST', `${base}/entries/${entry.id}/check-in`, { kitChecked: true, weaponChecked: true })
    await api('POST', `${base}/phase`, { to: 'pools' })
    await api('POST', `${base}/pools/draw`, { drawKey: `harvest-open-2026-${t.weapon}` })
    const { matches } = await api<{ matches: MatchSummary[] }>('GET', `${base}/matches?stage=pool`)
    // The same share of every pool, as when all rings fence at once.
    const pools = new Map<number | null, MatchSummary[]>()
    for (const m of matches) pools.set(m.poolId, [...(pools.get(m.poolId) ?? []), m])
    const toFight = [...pools.values()].flatMap(list => list.slice(0, Math.round(list.length * t.share)))
    for (const match of toFight) await fight(base, match, t.format)
    if (t.share === 1) await api('POST', `${base}/phase`, { to: 'finals' })
    console.log(`demo event: ${t.name}: ${entries.length} fighters, ${toFight.length} of ${matches.length} pool matches fought`)
  }
  await api('POST', `${eventApi}/publish`)
  console.log(`demo event: Wrenmouth Harvest Open published at ${APP}/site/saltmarsh-sword-guild/events/${EVENT_SLUG}`)
  // Footage is a bonus: the demo event stands without it.
  await demoFootage(clubApi, event.id, fencingFrom, Date.now()).catch((err) => {
    console.log(`demo event: no demo footage (${err instanceof Error ? err.message : err})`)
  })
}

/**
 * A made-up recording of ring 1 (ffmpeg's test picture and a tone, no real footage) covering the
 * time the demo desk recorded its bouts, uploaded the way the footage page does it, so that the
 * demo has marks to sync and matches to cut. Skipped without ffmpeg.
 */
async function demoFootage(clubApi: string, eventId: number, from: number, to: number) {
  const run = promisify(execFile)
  if (!(await run('ffmpeg', ['-version']).then(() => true, () => false))) {
    console.log('demo event: ffmpeg is not installed, so no demo footage')
    return
  }
  const dir = await mkdtemp(path.join(tmpdir(), 'unscathed-demo-'))
  try {
    // MP4 keeps the start in whole seconds; the picture runs from 5 s before the first bout.
    const start = Math.floor((from - 5000) / 1000) * 1000
    const seconds = Math.min(90, Math.max(60, Math.ceil((to - start) / 1000) + 10))
    const file = path.join(dir, 'ring-1-demo.mp4')
    await run('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', 'testsrc2=size=640x360:rate=25', '-f', 'lavfi', '-i', 'sine=frequency=330:sample_rate=48000',
      '-t', String(seconds), '-c:v', 'libx264', '-preset', 'ultrafast', '-crf', '30', '-pix_fmt', 'yuv420p', '-g', '50', '-c:a', 'aac', '-b:a', '96k',
      '-metadata', `creation_time=${new Date(start).toISOString()}`, '-movflags', '+faststart', file])
    const bytes = await readFile(file)
    await api('POST', '/api/auth/sign-in', COMMENTATOR)
    const rec = await api<{ id: number, partSize: number, partCount: number }>('POST', `${clubApi}/recordings`, {
      eventId, ring: 1, title: 'Ring 1, pools (demo footage)', fileName: 'ring-1-demo.mp4', contentType: 'video/mp4', bytes: bytes.length,
    })
    const partNumbers = Array.from({ length: rec.partCount }, (_, i) => i + 1)
    const { urls } = await api<{ urls: { partNumber: number, url: string }[] }>('POST', `${clubApi}/recordings/${rec.id}/part-urls`, { partNumbers })
    const parts = []
    for (const { partNumber, url } of urls) {
      const res = await fetch(url, { method: 'PUT', body: new Uint8Array(bytes.subarray((partNumber - 1) * rec.partSize, partNumber * rec.partSize)) })
      if (!res.ok) throw new Error(`the store answered ${res.status} to part ${partNumber}`)
      parts.push({ partNumber, etag: res.headers.get('etag') ?? '' })
    }
    await api('POST', `${clubApi}/recordings/${rec.id}/complete`, { parts })
    console.log(`demo event: ${seconds} s of demo footage for ring 1 uploaded (it is read by the worker in a moment)`)
  }
  finally {
    await rm(dir, { recursive: true, force: true })
  }
}

main().catch((err) => {
  console.error('demo event: loading failed:', err instanceof Error ? err.message : err)
  process.exit(1)
})
