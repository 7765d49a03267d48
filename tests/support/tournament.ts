// Set-up for the tests of pools, matches, standings and finals: an event, a tournament and
// checked-in fighters made through the API, the way an organizer does it, and builders for the
// ring desk's entries. All names are invented.
import { expect } from 'vitest'
import type { Action, MatchEntry, RuleSetInput, Side, Target } from '../../shared/rules'
import { presetCopy } from '../../shared/rules'
import type { TestClub } from './fixtures'
import { PASSWORD } from './fixtures'
import { Client } from './http'

export const as = (club: TestClub, role: keyof TestClub['members']) => new Client().signIn(club.members[role].email, PASSWORD)

export const CHECKS = { kitChecked: true, weaponChecked: true }

/** Invented fighters of the demo's invented clubs. */
export const ROSTER = [
  { name: 'Hedda Crane', clubName: 'Ironquay Fencing Hall' },
  { name: 'Alder Mossley', clubName: 'North Downs Buckler Circle' },
  { name: 'Bryony Tallis', clubName: 'Lanterngate Historical Fencing' },
  { name: 'Cobb Wetherell', clubName: 'Greyfield Sword Society' },
  { name: 'Dorrit Vane', clubName: 'Old Mill Fencing School' },
  { name: 'Esk Farrow', clubName: 'Saltmarsh Sword Guild' },
  { name: 'Fenna Rook', clubName: 'Ironquay Fencing Hall' },
  { name: 'Garin Oakes', clubName: 'North Downs Buckler Circle' },
  { name: 'Hollis Brand', clubName: 'Lanterngate Historical Fencing' },
  { name: 'Ilse Marrow', clubName: 'Greyfield Sword Society' },
  { name: 'Jory Penhale', clubName: 'Old Mill Fencing School' },
  { name: 'Kestra Lowe', clubName: 'Saltmarsh Sword Guild' },
] as const

export interface Fixture {
  club: TestClub
  organizer: Client
  base: string
  eventId: number
  eventSlug: string
  tournamentId: number
  /** Entry ids by fighter name. */
  entries: Map<string, number>
}

let counter = 0

/** A rule set from a preset, with some settings changed. */
export async function makeRuleSet(organizer: Client, club: TestClub, patch: Partial<RuleSetInput> = {}, preset: 'first-hit-three-bouts' | 'points-to-seven' = 'first-hit-three-bouts') {
  counter += 1
  const res = await organizer.post(`/api/clubs/${club.id}/rule-sets`, { name: `Harvest rules ${counter}`, settings: { ...presetCopy(preset), ...patch } })
  expect(res.status).toBe(201)
  return res.data.id as number
}

export interface FixtureOptions {
  ruleSetId?: number
  poolSize?: number
  qualifyCount?: number
  rings?: number
  finalsFormat?: 'bracket' | 'round-robin'
  bronzeMatch?: boolean
  /** Fighters to enter (from ROSTER by default), each checked in unless listed in `notCheckedIn`. */
  fighters?: readonly { name: string, clubName: string, seed?: number }[]
  notCheckedIn?: readonly string[]
  /** Move the tournament to its pools phase (default true). */
  startPools?: boolean
}

/** An event with one tournament and its fighters entered and checked in, in the pools phase. */
export async function makeFixture(club: TestClub, organizer: Client, options: FixtureOptions = {}): Promise<Fixture> {
  counter += 1
  const event = await organizer.post(`/api/clubs/${club.id}/events`, {
    name: 'Wrenmouth Harvest Open', slug: `harvest-${counter}`, startsOn: '2026-09-12', endsOn: '2026-09-12',
    venue: 'Old Net Loft, Wrenmouth', rings: options.rings ?? 3, emergencyNumber: '112', firstAidPoint: 'Beside ring 1',
  })
  expect(event.status).toBe(201)
  const ruleSetId = options.ruleSetId ?? await makeRuleSet(organizer, club)
  const tournament = await organizer.post(`/api/clubs/${club.id}/events/${event.data.id}/tournaments`, {
    name: 'Sword and buckler', weapon: 'sword and buckler', ruleSetId,
    poolSize: options.poolSize ?? 5, ...(options.qualifyCount === undefined ? {} : { qualifyCount: options.qualifyCount }),
    ...(options.finalsFormat === undefined ? {} : { finalsFormat: options.finalsFormat }),
    ...(options.bronzeMatch === undefined ? {} : { bronzeMatch: options.bronzeMatch }),
  })
  expect(tournament.status).toBe(201)
  const base = `/api/clubs/${club.id}/events/${event.data.id}/tournaments/${tournament.data.id}`
  const entries = new Map<string, number>()
  const fighters: readonly { name: string, clubName: string, seed?: number }[] = options.fighters ?? ROSTER
  for (const f of fighters) {
    const fighterId = await rosterFighter(organizer, club, f.name, f.clubName)
    const entry = await organizer.post(`${base}/entries`, { fighterId, seed: f.seed ?? null })
    expect(entry.status).toBe(201)
    entries.set(f.name, entry.data.id)
    if (!options.notCheckedIn?.includes(f.name)) {
      expect((await organizer.post(`${base}/entries/${entry.data.id}/check-in`, CHECKS)).status).toBe(200)
    }
  }
  if (options.startPools ?? true) expect((await organizer.post(`${base}/phase`, { to: 'pools' })).status).toBe(200)
  return { club, organizer, base, eventId: event.data.id, eventSlug: event.data.slug, tournamentId: tournament.data.id, entries }
}

async function rosterFighter(organizer: Client, club: TestClub, name: string, clubName: string): Promise<number> {
  const res = await organizer.post(`/api/clubs/${club.id}/fighters`, { name, clubName })
  if (res.status === 201) return res.data.id
  const found = await organizer.get(`/api/clubs/${club.id}/fighters?q=${encodeURIComponent(name)}`)
  return found.data.fighters.find((f: { clubName: string }) => f.clubName === clubName).id
}

/** Draws the pools with a key and answers them. */
export async function drawPools(f: Fixture, drawKey = 'harvest') {
  const res = await f.organizer.post(`${f.base}/pools/draw`, { drawKey })
  expect(res.status).toBe(201)
  return res.data.pools as PoolView[]
}

export interface FighterRef { entryId: number, fighterId: number, name: string, clubName: string }
export interface MatchView {
  id: number
  poolId: number | null
  bracketKey: string | null
  order: number
  sideA: FighterRef | null
  sideB: FighterRef | null
  status: string
  version: number
  score: { a: number, b: number }
  winner: Side | 'draw' | null
}
export interface PoolView {
  id: number
  number: number
  ringNumber: number
  fighters: (FighterRef & { position: number, seed: number | null, status: string })[]
  matches: MatchView[]
}

/** The side a fighter (by name) takes in a match. */
export function sideOf(match: MatchView, name: string): Side {
  if (match.sideA?.name === name) return 'a'
  if (match.sideB?.name === name) return 'b'
  throw new Error(`${name} does not fence in match ${match.id}`)
}

/** The match of a pool between two fighters, by name. */
export function matchBetween(pools: readonly PoolView[], x: string, y: string): MatchView {
  const match = pools.flatMap(p => p.matches).find(m => [m.sideA?.name, m.sideB?.name].sort().join('|') === [x, y].sort().join('|'))
  if (!match) throw new Error(`No match between ${x} and ${y}`)
  return match
}

// ——— the desk's entries ———

let entryCount = 0
const nextId = () => `desk-${Date.now().toString(36)}-${++entryCount}`

export const clean = (side: Side, target: Target = 'torso', action: Action = 'cut', id = nextId()): MatchEntry =>
  ({ kind: 'clean', id, side, target, action })
export const afterblow = (side: Side, first: [Target, Action], answer: [Target, Action], id = nextId()): MatchEntry =>
  ({ kind: 'afterblow', id, side, target: first[0], action: first[1], afterblow: { target: answer[0], action: answer[1] } })
export const double = (a: [Target, Action] = ['torso', 'cut'], b: [Target, Action] = ['torso', 'cut'], id = nextId()): MatchEntry =>
  ({ kind: 'double', id, a: { target: a[0], action: a[1] }, b: { target: b[0], action: b[1] } })
export const voided = (reason: 'not-seen' | 'no-valid-hit' = 'not-seen', id = nextId()): MatchEntry => ({ kind: 'void', id, reason })

/** Posts entries to a match at its current version (read first unless given). */
export async function record(client: Client, base: string, matchId: number, entries: MatchEntry[], expectedVersion?: number) {
  const version = expectedVersion ?? (await client.get(`${base}/matches/${matchId}`)).data.match.version
  return client.post(`${base}/matches/${matchId}/entries`, { expectedVersion: version, entries })
}

/** Fences a whole first-hit match: `wins` of the bouts clean hits (torso) for the first name, the rest for the second. */
export async function fenceMatch(f: Fixture, match: MatchView, first: string, wins: number, bouts = 3) {
  const a = sideOf(match, first)
  const b: Side = a === 'a' ? 'b' : 'a'
  const entries = Array.from({ length: bouts }, (_, i) => clean(i < wins ? a : b))
  const res = await record(f.organizer, f.base, match.id, entries)
  expect(res.status, JSON.stringify(res.data)).toBe(201)
  return res
}
