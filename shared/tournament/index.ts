// The tournament engine: pools, bout order, finals and the ring schedule. Pure functions, no I/O,
// shared by the desk, the boards, the server and the tests.
export type { Entry, Pair, Pairing } from './types'
export { hashKey, randomFrom, shuffleWithKey } from './random'
export {
  DEFAULT_MIN_POOL_SIZE,
  drawOrder,
  drawPools,
  planPools,
  serpentinePool,
  validateMove,
} from './pools'
export type {
  DrawOptions,
  MoveCheck,
  MoveOptions,
  MoveWarning,
  MoveWarningKind,
  PlanOptions,
  PoolDraw,
  PoolMove,
  PoolNote,
  PoolNoteKind,
  PoolPlan,
} from './pools'
export { MAX_POOL_SIZE, POOL_ORDER_TABLES, generateOrder, poolOrder, restStats, toPairings } from './order'
export type { RestStats } from './order'
export { bergerOrder, bergerRounds } from './berger'
export type { BergerRound } from './berger'
export {
  BRONZE_MATCH_ID,
  advance,
  bracketPlaces,
  bracketSize,
  buildBracket,
  readyMatches,
  reopen,
  roundName,
  roundRobinFinal,
  seedOrder,
} from './bracket'
export type {
  Bracket,
  BracketLink,
  BracketMatch,
  BracketMatchStatus,
  BracketOptions,
  BracketPlaces,
  BracketSide,
  RoundRobinMethod,
} from './bracket'
export { planSchedule, ringQueues } from './schedule'
export type {
  MatchKey,
  RingQueue,
  RingTimeline,
  Schedule,
  ScheduleConflict,
  ScheduleConflictKind,
  ScheduledMatch,
  ScheduleInput,
  ScheduleMatch,
  SchedulePool,
  ScheduleProgress,
} from './schedule'
export { openFinalMatches } from './finals'
export type { FinalMatchState } from './finals'
