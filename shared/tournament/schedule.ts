export type MatchKey = string | number

export interface SchedulePool {
  id: number
  ringId: number
}

export interface ScheduleMatch {
  id: MatchKey
  /** A pool match takes its pool's ring. */
  poolId?: number | null
  /** A match outside the pools (finals) names its ring. */
  ringId?: number | null
  fighterIds: readonly [number, number]
  /** Estimated length, changeover not included. */
  minutes: number
}

export interface ScheduleInput {
  /** Ring ids, in the order the rings are shown. */
  rings: readonly number[]
  pools: readonly SchedulePool[]
  /**
   * Every match of the day, including those of other tournaments in the same rings, so that a
   * fighter entered twice is seen. Each ring takes its matches in this order.
   */
  matches: readonly ScheduleMatch[]
  /** Milliseconds since 1970 (Date.getTime()). */
  start: number
  /** Between two matches in one ring. */
  changeoverMinutes: number
  /** What a fighter needs to get from one ring to another (default 0). */
  ringChangeMinutes?: number
}

export interface ScheduleProgress {
  /** The time of the re-plan, in milliseconds since 1970. */
  now: number
  finished: readonly MatchKey[]
  underway: readonly { id: MatchKey, startedAt: number }[]
}

export interface ScheduledMatch {
  id: MatchKey
  ringId: number
  poolId: number | null
  fighterIds: readonly [number, number]
  start: number
  end: number
  status: 'underway' | 'pending'
}

export interface RingTimeline {
  ringId: number
  /** The match under way, then the pending ones in the order they will be fenced. */
  matches: ScheduledMatch[]
  finished: MatchKey[]
  /** When the ring's last match should end; null when nothing is left. */
  end: number | null
}

export type ScheduleConflictKind
  = | 'fighter-waits' // a ring waits for a fighter busy elsewhere
    | 'fighter-overlap' // the recorded state has a fighter in two matches at once
    | 'ring-overlap' // the recorded state has two matches under way in one ring

export interface ScheduleConflict {
  kind: ScheduleConflictKind
  matchId: MatchKey
  ringId: number
  otherMatchId: MatchKey
  otherRingId: number
  fighterId: number | null
  /** How long the match waits, or how long the two overlap. */
  minutes: number
  message: string
}

export interface Schedule {
  rings: RingTimeline[]
  conflicts: ScheduleConflict[]
  end: number | null
}

const MINUTE = 60_000

function requireMinutes(value: number, name: string, allowZero: boolean): void {
  if (!Number.isFinite(value) || value < 0 || (!allowZero && value === 0)) {
    throw new Error(`${name} must be a ${allowZero ? 'non-negative' : 'positive'} number of minutes, not ${value}`)
  }
}

/**
 * A timeline per ring. Each ring fences its matches in the order given, one at a time with a
 * changeover between them; a match whose fighter is still busy in another ring waits for them,
 * and every such wait is reported as a conflict. With progress, finished matches drop out, the
 * matches under way keep their start, and the rest is planned again from `now`.
 */
export function planSchedule(input: ScheduleInput, progress?: ScheduleProgress): Schedule {
  requireMinutes(input.changeoverMinutes, 'The changeover', true)
  const ringChange = input.ringChangeMinutes ?? 0
  requireMinutes(ringChange, 'The change of rings', true)
  const rings = new Set(input.rings)
  const poolRing = new Map(input.pools.map(pool => [pool.id, pool.ringId]))
  for (const [poolId, ringId] of poolRing) {
    if (!rings.has(ringId)) throw new Error(`Pool ${poolId} is in ring ${ringId}, which is not in the schedule`)
  }

  const byId = new Map<MatchKey, ScheduledMatch>()
  const queues = new Map<number, ScheduledMatch[]>(input.rings.map(ring => [ring, []]))
  for (const match of input.matches) {
    if (byId.has(match.id)) throw new Error(`Match ${match.id} is listed twice`)
    requireMinutes(match.minutes, `Match ${match.id}'s length`, false)
    const [a, b] = match.fighterIds
    if (a === b) throw new Error(`Match ${match.id} has fighter ${a} on both sides`)
    const poolId = match.poolId ?? null
    if (poolId !== null && !poolRing.has(poolId)) throw new Error(`Match ${match.id} is in pool ${poolId}, which has no ring`)
    const ringId = match.ringId ?? (poolId === null ? undefined : poolRing.get(poolId))
    if (ringId === undefined || !rings.has(ringId)) throw new Error(`Match ${match.id} has no ring in the schedule`)
    const scheduled: ScheduledMatch = {
      id: match.id,
      ringId,
      poolId,
      fighterIds: [a, b],
      start: input.start,
      end: input.start + match.minutes * MINUTE,
      status: 'pending',
    }
    byId.set(match.id, scheduled)
    queues.get(ringId)!.push(scheduled)
  }

  // Nothing new starts before the day does, nor before the moment of a re-plan.
  const now = Math.max(input.start, progress?.now ?? input.start)
  const finished = new Set<MatchKey>(progress?.finished ?? [])
  const underway = new Map<MatchKey, number>()
  for (const id of finished) {
    if (!byId.has(id)) throw new Error(`Finished match ${id} is not in the schedule`)
  }
  for (const { id, startedAt } of progress?.underway ?? []) {
    if (!byId.has(id)) throw new Error(`Match ${id}, under way, is not in the schedule`)
    if (finished.has(id)) throw new Error(`Match ${id} is both finished and under way`)
    underway.set(id, startedAt)
  }

  const conflicts: ScheduleConflict[] = []
  const ringFree = new Map<number, number>(input.rings.map(ring => [ring, now]))
  const ringUsed = new Set<number>()
  const fighterFree = new Map<number, { at: number, ringId: number, matchId: MatchKey }>()
  const busy = (match: ScheduledMatch) => {
    for (const fighter of match.fighterIds) {
      const held = fighterFree.get(fighter)
      if (!held || held.at < match.end) fighterFree.set(fighter, { at: match.end, ringId: match.ringId, matchId: match.id })
    }
  }

  const running: ScheduledMatch[] = []
  for (const [id, startedAt] of underway) {
    const match = byId.get(id)!
    const minutes = (match.end - match.start) / MINUTE
    match.start = startedAt
    // A match that runs over its estimate is at least still going now.
    match.end = Math.max(startedAt + minutes * MINUTE, now)
    match.status = 'underway'
    running.push(match)
  }
  running.forEach((match, i) => {
    for (const other of running.slice(0, i)) {
      const overlap = (Math.min(match.end, other.end) - Math.max(match.start, other.start)) / MINUTE
      if (overlap <= 0) continue
      if (other.ringId === match.ringId) {
        conflicts.push(conflict('ring-overlap', match, other, null, overlap,
          `Matches ${other.id} and ${match.id} are both under way in ring ${match.ringId}`))
      }
      for (const fighter of match.fighterIds.filter(f => other.fighterIds.includes(f))) {
        conflicts.push(conflict('fighter-overlap', match, other, fighter, overlap,
          `Fighter ${fighter} is under way in match ${other.id} (ring ${other.ringId}) and match ${match.id} (ring ${match.ringId})`))
      }
    }
  })
  for (const match of running) {
    ringFree.set(match.ringId, Math.max(ringFree.get(match.ringId)!, match.end))
    ringUsed.add(match.ringId)
    busy(match)
  }

  const pending = new Map<number, ScheduledMatch[]>()
  for (const [ring, queue] of queues) {
    pending.set(ring, queue.filter(m => !finished.has(m.id) && !underway.has(m.id)))
  }

  const changeover = input.changeoverMinutes * MINUTE
  const ringReady = (ring: number) => ringFree.get(ring)! + (ringUsed.has(ring) ? changeover : 0)
  const fighterReady = (fighter: number, ring: number) => {
    const held = fighterFree.get(fighter)
    if (!held) return -Infinity
    return held.at + (held.ringId === ring ? 0 : ringChange * MINUTE)
  }

  for (;;) {
    let best: { ring: number, start: number } | null = null
    for (const ring of input.rings) {
      const match = pending.get(ring)![0]
      if (!match) continue
      const start = Math.max(ringReady(ring), ...match.fighterIds.map(f => fighterReady(f, ring)))
      if (!best || start < best.start) best = { ring, start }
    }
    if (!best) break
    const match = pending.get(best.ring)!.shift()!
    const length = match.end - match.start
    const ready = ringReady(best.ring)
    if (best.start > ready) {
      const fighter = match.fighterIds.reduce((a, b) => fighterReady(a, best.ring) >= fighterReady(b, best.ring) ? a : b)
      const held = fighterFree.get(fighter)!
      const other = byId.get(held.matchId)!
      const wait = (best.start - ready) / MINUTE
      conflicts.push(conflict('fighter-waits', match, other, fighter, wait,
        `Match ${match.id} in ring ${match.ringId} waits ${formatMinutes(wait)} for fighter ${fighter}, who fences match ${other.id} in ring ${other.ringId}`))
    }
    match.start = best.start
    match.end = best.start + length
    ringFree.set(best.ring, match.end)
    ringUsed.add(best.ring)
    busy(match)
  }

  const timelines = input.rings.map((ringId): RingTimeline => {
    const queue = queues.get(ringId)!
    const matches = queue
      .filter(m => !finished.has(m.id))
      .sort((a, b) => (a.status === b.status ? a.start - b.start : a.status === 'underway' ? -1 : 1))
    return {
      ringId,
      matches,
      finished: queue.filter(m => finished.has(m.id)).map(m => m.id),
      end: matches.length === 0 ? null : Math.max(...matches.map(m => m.end)),
    }
  })
  const ends = timelines.flatMap(t => (t.end === null ? [] : [t.end]))
  return { rings: timelines, conflicts, end: ends.length === 0 ? null : Math.max(...ends) }
}

function conflict(
  kind: ScheduleConflictKind,
  match: ScheduledMatch,
  other: ScheduledMatch,
  fighterId: number | null,
  minutes: number,
  message: string,
): ScheduleConflict {
  return { kind, matchId: match.id, ringId: match.ringId, otherMatchId: other.id, otherRingId: other.ringId, fighterId, minutes, message }
}

function formatMinutes(minutes: number): string {
  const rounded = Math.round(minutes * 10) / 10
  return `${rounded} min`
}

export interface RingQueue {
  ringId: number
  /** The match under way, if any. */
  now: ScheduledMatch | null
  /** The next to fence: fighters at the ring, kit on. */
  onDeck: ScheduledMatch | null
  /** The one after: fighters get ready. */
  next: ScheduledMatch | null
  /** How many more are pending after those. */
  later: number
}

/** What each ring shows its fighters: now, on deck, next. */
export function ringQueues(schedule: Schedule): RingQueue[] {
  return schedule.rings.map((ring) => {
    const now = ring.matches.find(m => m.status === 'underway') ?? null
    const pending = ring.matches.filter(m => m.status === 'pending')
    return {
      ringId: ring.ringId,
      now,
      onDeck: pending[0] ?? null,
      next: pending[1] ?? null,
      later: Math.max(0, pending.length - 2),
    }
  })
}
