import { randomBytes } from 'node:crypto'
import { and, asc, count, eq, inArray, ne, or } from 'drizzle-orm'
import { MAX_POOL_SIZE, drawPools, planPools, poolOrder, toPairings } from '#shared/tournament'
import type { Entry, MoveWarning, PoolNote } from '#shared/tournament'
import type { DbTx } from './events'
import type { FighterRef, MatchSummary } from './matches'

// Pools as the engine sees them (entries with a seed and a club number) and as the routes show
// them (fighters with names, and their matches).

type Tournament = typeof schema.tournaments.$inferSelect
type Pool = typeof schema.pools.$inferSelect

export interface PoolFighterView {
  entryId: number
  fighterId: number
  name: string
  clubName: string
  seed: number | null
  position: number
  status: FighterRef['status']
}

export interface PoolView {
  id: number | null
  number: number
  ringNumber: number
  fighters: PoolFighterView[]
  matches: MatchSummary[]
}

export interface PlannedMatch {
  order: number
  sideA: FighterRef
  sideB: FighterRef
}

/** The scope under which the draw of the pools is recorded in `tournament_lots`. */
export const DRAW_SCOPE = 'draw'

export function newDrawKey(): string {
  return randomBytes(6).toString('hex')
}

/**
 * The engine parts fighters by a club number; ours are free text, so each distinct club name
 * (ignoring case and spacing) gets a number, in order of first appearance.
 */
export function engineEntries(refs: readonly FighterRef[]): { entries: Entry[], clubNames: Map<number, string> } {
  const numbers = new Map<string, number>()
  const clubNames = new Map<number, string>()
  const entries = refs.map((ref) => {
    const key = ref.clubName.trim().replace(/\s+/g, ' ').toLowerCase()
    let clubId = numbers.get(key)
    if (clubId === undefined) {
      clubId = numbers.size + 1
      numbers.set(key, clubId)
      clubNames.set(clubId, ref.clubName)
    }
    return { id: ref.entryId, seed: ref.seed, clubId }
  })
  return { entries, clubNames }
}

/** The bout order of a pool, by position: the pool order tables (the rule sets have no Berger setting). */
export function plannedMatches(members: readonly FighterRef[]): PlannedMatch[] {
  if (members.length < 2) return []
  const byId = new Map(members.map(m => [m.entryId, m]))
  return toPairings(poolOrder(members.length), members.map(m => m.entryId))
    .map(([a, b], i) => ({ order: i + 1, sideA: byId.get(a)!, sideB: byId.get(b)! }))
}

/** What a drawn pool looks like before it is stored (a dry run): no ids, matches not yet fenced. */
export function draftView(number: number, ringNumber: number, members: readonly FighterRef[]): PoolView {
  return {
    id: null,
    number,
    ringNumber,
    fighters: members.map((m, i) => fighterView(m, i + 1)),
    matches: plannedMatches(members).map(p => ({
      id: 0,
      poolId: null,
      stage: 'pool',
      bracketKey: null,
      order: p.order,
      sideA: p.sideA,
      sideB: p.sideB,
      status: 'scheduled',
      version: 0,
      score: { a: 0, b: 0 },
      bouts: { counted: 0, void: 0 },
      winner: null,
      finishedReason: null,
      forfeit: null,
      startedAt: null,
      finishedAt: null,
    })),
  }
}

function fighterView(ref: FighterRef, position: number): PoolFighterView {
  return {
    entryId: ref.entryId,
    fighterId: ref.fighterId,
    name: ref.name,
    clubName: ref.clubName,
    seed: ref.seed,
    position,
    status: ref.status,
  }
}

/** The pools of a tournament, each with its members in position order. */
export async function loadPools(db: DbTx, tournamentId: number) {
  const p = schema.pools
  const pm = schema.poolMembers
  const pools = await db.select().from(p).where(eq(p.tournamentId, tournamentId)).orderBy(asc(p.number))
  const members = pools.length === 0
    ? []
    : await db.select().from(pm).where(inArray(pm.poolId, pools.map(pool => pool.id))).orderBy(asc(pm.poolId), asc(pm.position))
  return pools.map(pool => ({ pool, entryIds: members.filter(m => m.poolId === pool.id).map(m => m.entryId) }))
}

export type LoadedPool = Awaited<ReturnType<typeof loadPools>>[number]

/** Every pool with its fighters and matches, as the organizer's pages and the desks show them. */
export async function poolViews(db: DbTx, tournament: Tournament): Promise<PoolView[]> {
  const loaded = await loadPools(db, tournament.id)
  if (loaded.length === 0) return []
  const refs = await fighterRefs(db, tournament.id)
  const m = schema.matches
  const rows = await db.select().from(m)
    .where(and(eq(m.tournamentId, tournament.id), eq(m.stage, 'pool'))).orderBy(asc(m.poolId), asc(m.orderInPool))
  const summaries = await matchSummaries(db, tournament, rows, refs)
  return loaded.map(({ pool, entryIds }) => ({
    id: pool.id,
    number: pool.number,
    ringNumber: pool.ringNumber,
    fighters: entryIds.map((id, i) => fighterView(refs.get(id)!, i + 1)),
    matches: summaries.filter(s => s.poolId === pool.id),
  }))
}

/** True when a match of these pools has an entry or a result: the pools are then settled. */
export async function poolsHaveResults(db: DbTx, poolIds: number[]): Promise<boolean> {
  if (poolIds.length === 0) return false
  const m = schema.matches
  const [row] = await db.select({ n: count() }).from(m)
    .where(and(inArray(m.poolId, poolIds), or(ne(m.status, 'scheduled'), ne(m.version, 0))))
  return (row?.n ?? 0) > 0
}

export interface DrawPlan {
  drawKey: string
  order: number[]
  pools: FighterRef[][]
  notes: DrawNote[]
}

export interface DrawNote {
  kind: PoolNote['kind']
  poolNumber: number
  clubName: string
  fighters: string[]
  message: string
}

/** Pools for the checked-in fighters: how many by the tournament's pool size, then the engine's draw. */
export function planDraw(tournament: Tournament, checkedIn: readonly FighterRef[], drawKey: string): DrawPlan {
  if (checkedIn.length < 2) {
    throw conflictError(`The pools need at least 2 checked-in fighters; ${checkedIn.length} checked in`)
  }
  const { entries, clubNames } = engineEntries(checkedIn)
  const plan = planPools(entries.length, Math.min(tournament.poolSize, MAX_POOL_SIZE), { maxSize: MAX_POOL_SIZE })
  const draw = drawPools(entries, plan.poolCount, { drawKey })
  const byId = new Map(checkedIn.map(ref => [ref.entryId, ref]))
  const notes = draw.notes.map((note): DrawNote => {
    const clubName = clubNames.get(note.clubId)!
    const fighters = note.fighterIds.map(id => byId.get(id)!.name)
    const why = note.kind === 'more-fighters-than-pools'
      ? `the club has more fighters than there are pools`
      : note.kind === 'kept-for-seeding'
        ? 'no exchange within their seed bands parts them'
        : 'club separation was turned off'
    return {
      kind: note.kind,
      poolNumber: note.pool + 1,
      clubName,
      fighters,
      message: `Pool ${note.pool + 1} holds ${fighters.length} fighters of ${clubName} (${fighters.join(', ')}): ${why}.`,
    }
  })
  return {
    drawKey,
    order: draw.pools.flat().map(e => e.id),
    pools: draw.pools.map(pool => pool.map(e => byId.get(e.id)!)),
    notes,
  }
}

/** Stores a draw in place of any earlier one: pools (rings in turn), members, matches, and the draw's record. */
export async function writeDraw(tx: DbTx, tournamentId: number, rings: number, plan: DrawPlan) {
  await tx.delete(schema.pools).where(eq(schema.pools.tournamentId, tournamentId))
  const created = await tx.insert(schema.pools).values(plan.pools.map((_, i) => ({
    tournamentId,
    number: i + 1,
    ringNumber: (i % rings) + 1,
  }))).returning()
  const byNumber = new Map(created.map(pool => [pool.number, pool]))
  for (const [i, members] of plan.pools.entries()) {
    await fillPool(tx, tournamentId, byNumber.get(i + 1)!, members)
  }
  const l = schema.tournamentLots
  await tx.delete(l).where(and(eq(l.tournamentId, tournamentId), eq(l.scope, DRAW_SCOPE)))
  await tx.insert(l).values({ tournamentId, scope: DRAW_SCOPE, seed: plan.drawKey, fighters: 'checked-in', order: plan.order.map(String) })
}

/** Empties pools of their members and matches, before they are filled again. */
export async function clearPools(tx: DbTx, poolIds: number[]) {
  await tx.delete(schema.matches).where(inArray(schema.matches.poolId, poolIds))
  await tx.delete(schema.poolMembers).where(inArray(schema.poolMembers.poolId, poolIds))
}

/** Puts fighters into an empty pool in position order and makes its matches in the pool's bout order. */
export async function fillPool(tx: DbTx, tournamentId: number, pool: Pool, members: readonly FighterRef[]) {
  if (members.length === 0) return
  await tx.insert(schema.poolMembers).values(members.map((m, i) => ({ poolId: pool.id, entryId: m.entryId, position: i + 1 })))
  const planned = plannedMatches(members)
  if (planned.length === 0) return
  await tx.insert(schema.matches).values(planned.map(p => ({
    tournamentId,
    poolId: pool.id,
    stage: 'pool' as const,
    orderInPool: p.order,
    sideAEntry: p.sideA.entryId,
    sideBEntry: p.sideB.entryId,
  })))
}

/** The engine's move warnings, with names in place of ids. */
export function moveWarnings(warnings: readonly MoveWarning[], fighter: FighterRef, toPool: number, sizes: number[]) {
  return warnings.map(w => ({
    kind: w.kind,
    message: w.kind === 'same-club'
      ? `${fighter.name} joins fighters of the same club (${fighter.clubName}) in pool ${toPool}`
      : `Pool sizes would be ${sizes.join(', ')}, differing by more than one`,
  }))
}

export function poolNotFound() {
  return notFoundError('Pool')
}
