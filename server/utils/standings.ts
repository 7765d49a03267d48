import { randomBytes } from 'node:crypto'
import { and, asc, eq, ne } from 'drizzle-orm'
import { assessQualification, computeStandings } from '#shared/rules'
import type { CutStatus, FighterOutlook, LotDraw, Pool, PoolMatch, QualificationOutlook, RuleSet, StandingRow, Standings } from '#shared/rules'
import type { DbTx } from './events'
import type { FighterRef } from './matches'
import type { LoadedPool } from './pools'

// Pool tables, the overall ranking and the finals' field, from the stored logs. Where the engine
// has to draw a lot, the seed is recorded in `tournament_lots` the first time a table is final, so
// the same table always shows the same order.

type Tournament = typeof schema.tournaments.$inferSelect
type Match = typeof schema.matches.$inferSelect

export const OVERALL_SCOPE = 'overall'
export const poolScope = (poolId: number) => `pool:${poolId}`

export interface LotView {
  /**
   * Null while the table is not final (fighters level on everything are shown in a provisional
   * order) and for a table that never needed the lot.
   */
  seed: string | null
  provisional: boolean
  draws: { entryIds: number[], order: number[] }[]
}

/**
 * A table's row. `status` says where the fighter stands: withdrawn or expelled, else their outlook
 * for the finals (secured, reachable or out) from the overall qualification.
 */
export function standingRowView(row: StandingRow, refs: ReadonlyMap<number, FighterRef>, outlook: ReadonlyMap<string, CutStatus>) {
  const ref = refs.get(Number(row.fighterId))!
  const status: CutStatus | 'withdrawn' | 'expelled' = row.expelled ? 'expelled' : row.withdrawn ? 'withdrawn' : outlook.get(row.fighterId) ?? 'reachable'
  return {
    rank: row.rank,
    fighter: { entryId: ref.entryId, fighterId: ref.fighterId, name: ref.name, clubName: ref.clubName, seed: ref.seed },
    status,
    active: row.active,
    matchesFought: row.matchesFought,
    wins: row.wins,
    losses: row.losses,
    draws: row.draws,
    forfeitWins: row.forfeitWins,
    forfeitLosses: row.forfeitLosses,
    boutsFought: row.boutsFought,
    unharmed: row.unharmedBouts,
    survivalRate: row.survivalRate,
    scored: row.pointsScored,
    received: row.pointsReceived,
    indicator: row.indicator,
    doubles: row.doubles,
    cards: row.cards,
    separatedBy: row.separatedBy,
  }
}

export type StandingRowView = ReturnType<typeof standingRowView>

function outlookView(outlook: FighterOutlook, refs: ReadonlyMap<number, FighterRef>) {
  const ref = refs.get(Number(outlook.fighterId))!
  return {
    rank: outlook.rank,
    fighter: { entryId: ref.entryId, fighterId: ref.fighterId, name: ref.name, clubName: ref.clubName, seed: ref.seed },
    active: outlook.active,
    status: outlook.status,
    topN: outlook.topN,
    survival: outlook.survival,
    remainingMatches: outlook.remainingMatches,
    remainingBouts: outlook.remainingBouts,
  }
}

function lotView(seed: string | null, provisional: boolean, draws: readonly LotDraw[]): LotView {
  return {
    seed: provisional ? null : seed,
    provisional,
    draws: draws.map(d => ({ entryIds: d.fighterIds.map(Number), order: d.order.map(Number) })),
  }
}

function poolMatch(match: Match, entries: PoolMatch['entries']): PoolMatch {
  const base = { id: String(match.id), a: String(match.sideAEntry), b: String(match.sideBEntry), entries }
  if (match.status === 'finished') return { ...base, status: 'finished' }
  if (match.status === 'forfeit') return { ...base, status: 'forfeit', forfeitedBy: match.forfeitedBy! }
  return { ...base, status: 'unfought' }
}

/** The rules with the tournament's own number of finalists, which wins over the rule set's top N. */
export function qualificationRules(tournament: Tournament, ruleSet: RuleSet): RuleSet {
  return { ...ruleSet, qualification: { ...ruleSet.qualification, topN: tournament.qualifyCount } }
}

interface LotBook {
  tx: DbTx
  tournamentId: number
  seeds: Map<string, string>
  recorded: Set<string>
  locked: boolean
}

async function readLots(tx: DbTx, tournamentId: number, book?: LotBook): Promise<LotBook> {
  const l = schema.tournamentLots
  const rows = await tx.select({ scope: l.scope, seed: l.seed, fighters: l.fighters }).from(l)
    .where(and(eq(l.tournamentId, tournamentId), ne(l.scope, DRAW_SCOPE)))
  return {
    tx,
    tournamentId,
    seeds: new Map(rows.map(r => [r.scope, r.seed])),
    recorded: new Set(rows.map(r => `${r.scope}\u0000${r.fighters}`)),
    locked: book?.locked ?? false,
  }
}

/**
 * Computes a table with its scope's lot seed. A final table whose lot is not yet recorded takes a
 * new random seed and records its draws, under the tournament's lock so that two readers never
 * record two different lots.
 */
async function withLot<T>(book: LotBook, scope: string, complete: boolean, compute: (seed: string) => T, drawsOf: (result: T) => LotDraw[]) {
  const stored = book.seeds.get(scope)
  if (!complete) {
    const seed = stored ?? `provisional:${scope}`
    const result = compute(seed)
    return { result, lot: lotView(seed, stored === undefined, drawsOf(result)) }
  }
  let seed = stored ?? randomBytes(8).toString('hex')
  let result = compute(seed)
  const missing = (draws: LotDraw[]) => draws.filter(d => !book.recorded.has(`${scope}\u0000${d.fighterIds.join(',')}`))
  // Nothing new to record: a table the lot never had to separate has no seed to show.
  if (missing(drawsOf(result)).length === 0) return { result, lot: lotView(stored ?? null, false, drawsOf(result)) }

  if (!book.locked) {
    await book.tx.select({ id: schema.tournaments.id }).from(schema.tournaments).where(eq(schema.tournaments.id, book.tournamentId)).for('update')
    Object.assign(book, await readLots(book.tx, book.tournamentId, { ...book, locked: true }))
  }
  const now = book.seeds.get(scope)
  if (now !== undefined && now !== seed) {
    seed = now
    result = compute(seed)
  }
  const fresh = missing(drawsOf(result))
  if (fresh.length > 0) {
    await book.tx.insert(schema.tournamentLots).values(fresh.map(d => ({
      tournamentId: book.tournamentId, scope, seed, fighters: d.fighterIds.join(','), order: d.order,
    }))).onConflictDoNothing()
    book.seeds.set(scope, seed)
    for (const d of fresh) book.recorded.add(`${scope}\u0000${d.fighterIds.join(',')}`)
  }
  return { result, lot: lotView(seed, false, drawsOf(result)) }
}

const pending = (standings: Standings) => standings.matches.filter(m => m.counted === 'pending').length

export interface TournamentTables {
  pools: { poolId: number, number: number, complete: boolean, rows: StandingRowView[], lot: LotView }[]
  overall: { complete: boolean, pendingMatches: number, rows: StandingRowView[], lot: LotView }
  qualification: ReturnType<typeof qualificationView>
  cut: { topN: number, minSurvivalRate: number | null }
  /** For the finals: the overall ranking's engine rows, best first. */
  ranking: StandingRow[]
}

function qualificationView(outlook: QualificationOutlook, refs: ReadonlyMap<number, FighterRef>) {
  return {
    scope: 'overall' as const,
    topN: outlook.topN,
    minSurvivalRate: outlook.minSurvivalRate,
    complete: outlook.complete,
    fighters: outlook.fighters.map(f => outlookView(f, refs)),
  }
}

/**
 * Every pool's table, the overall ranking (all pools taken as one table, ranked by the same rule
 * set) and who can still reach the finals. Must run in a transaction: it may record a lot.
 */
export async function tournamentTables(tx: DbTx, tournament: Tournament, loaded: readonly LoadedPool[]): Promise<TournamentTables> {
  const ruleSet = rulesOf(tournament)
  const refs = await fighterRefs(tx, tournament.id)
  const m = schema.matches
  const rows = await tx.select().from(m)
    .where(and(eq(m.tournamentId, tournament.id), eq(m.stage, 'pool'))).orderBy(asc(m.poolId), asc(m.orderInPool))
  const logs = await matchLogs(tx, rows.map(r => r.id))
  const book = await readLots(tx, tournament.id)

  const enginePools = loaded.map(({ pool, entryIds }): Pool & { poolId: number, number: number } => ({
    poolId: pool.id,
    number: pool.number,
    fighters: entryIds.map(id => ({ id: String(id), withdrawn: refs.get(id)!.status === 'withdrawn' })),
    matches: rows.filter(r => r.poolId === pool.id).map(r => poolMatch(r, payloads(logs.get(r.id)!))),
    lotSeed: '',
  }))

  const tables = []
  for (const pool of enginePools) {
    const scope = poolScope(pool.poolId)
    // Whether a table is final does not depend on the seed.
    const complete = pending(computeStandings(ruleSet, { ...pool, lotSeed: 'probe' })) === 0
    const { result, lot } = await withLot(book, scope, complete, seed => computeStandings(ruleSet, { ...pool, lotSeed: seed }), s => s.lot.draws)
    tables.push({ pool, complete, result, lot })
  }

  const qualifying = qualificationRules(tournament, ruleSet)
  const union: Pool = {
    fighters: enginePools.flatMap(p => p.fighters),
    matches: enginePools.flatMap(p => p.matches),
    lotSeed: '',
  }
  const probe = assessQualification(qualifying, { ...union, lotSeed: 'probe' })
  const complete = enginePools.length > 0 && probe.complete
  const { result, lot } = await withLot(book, OVERALL_SCOPE, complete,
    seed => assessQualification(qualifying, { ...union, lotSeed: seed }), o => o.standings.lot.draws)

  const outlook = new Map(result.fighters.map(f => [f.fighterId, f.status]))
  return {
    pools: tables.map(t => ({
      poolId: t.pool.poolId, number: t.pool.number, complete: t.complete, rows: t.result.rows.map(r => standingRowView(r, refs, outlook)), lot: t.lot,
    })),
    overall: { complete, pendingMatches: pending(probe.standings), rows: result.standings.rows.map(r => standingRowView(r, refs, outlook)), lot },
    qualification: qualificationView(result, refs),
    cut: { topN: tournament.qualifyCount, minSurvivalRate: ruleSet.qualification.minSurvivalRate },
    ranking: result.standings.rows,
  }
}

/** The finalists: fighters still in, best first, who meet the survival cut, up to the tournament's number. */
export function finalists(tables: TournamentTables): number[] {
  const { topN, minSurvivalRate } = tables.cut
  return tables.ranking
    .filter(row => row.active && (minSurvivalRate === null || (row.survivalRate ?? 0) >= minSurvivalRate))
    .slice(0, topN)
    .map(row => Number(row.fighterId))
}

export const FINAL_SCOPE = 'final'

/**
 * The table of a round-robin final: the finalists as one pool, ranked by the same rule set, with
 * the lot recorded under the `final` scope once every match is settled. Must run in a transaction.
 */
export async function finalTable(tx: DbTx, tournament: Tournament, field: readonly number[], rows: readonly Match[]) {
  const ruleSet = rulesOf(tournament)
  const refs = await fighterRefs(tx, tournament.id)
  const logs = await matchLogs(tx, rows.map(r => r.id))
  const pool: Pool = {
    fighters: field.map(id => ({ id: String(id), withdrawn: refs.get(id)!.status === 'withdrawn' })),
    matches: rows.map(r => poolMatch(r, payloads(logs.get(r.id)!))),
    lotSeed: '',
  }
  const complete = pending(computeStandings(ruleSet, { ...pool, lotSeed: 'probe' })) === 0
  const book = await readLots(tx, tournament.id)
  const { result, lot } = await withLot(book, FINAL_SCOPE, complete, seed => computeStandings(ruleSet, { ...pool, lotSeed: seed }), s => s.lot.draws)
  // Everyone in a final has made the cut already.
  const outlook = new Map(field.map(id => [String(id), 'secured' as const]))
  return { complete, rows: result.rows.map(r => standingRowView(r, refs, outlook)), lot }
}
