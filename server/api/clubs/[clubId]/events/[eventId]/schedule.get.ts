import { and, asc, eq, inArray, isNotNull } from 'drizzle-orm'
import { planSchedule, ringQueues } from '#shared/tournament'
import type { ScheduleConflict, ScheduleMatch, ScheduledMatch } from '#shared/tournament'
import type { FighterRef } from '~~/server/utils/matches'

/**
 * What each ring fences now, on deck and next, and its whole timeline of matches still to fence,
 * estimated from this moment: every started tournament of the event, pools in their rings and the
 * finals in the first ring. Lengths are our estimates (see `estimatedMinutes` in
 * server/utils/matches.ts); a fighter entered in two tournaments is one person, so a ring waits
 * for them, and each such wait is a conflict named in words.
 */
export default defineEventHandler(async (event) => {
  const { clubId, eventId } = validParams(event, eventParams)
  await requireClubRole(event, clubId, [])
  const db = useDb()
  const row = await findEvent(db, clubId, eventId)
  const t = schema.tournaments
  const started = (await db.select().from(t).where(and(eq(t.eventId, row.id), isNotNull(t.frozenRules))).orderBy(asc(t.id)))
  const rings = Array.from({ length: row.rings }, (_, i) => i + 1)
  const ids = started.map(s => s.id)
  const p = schema.pools
  const m = schema.matches
  const pools = ids.length === 0 ? [] : await db.select().from(p).where(inArray(p.tournamentId, ids))
  const matches = ids.length === 0 ? [] : await db.select().from(m).where(inArray(m.tournamentId, ids))
  const poolById = new Map(pools.map(pool => [pool.id, pool]))
  const order = new Map(started.map((s, i) => [s.id, i]))
  matches.sort((x, y) => (x.stage === y.stage ? 0 : x.stage === 'pool' ? -1 : 1)
    || order.get(x.tournamentId)! - order.get(y.tournamentId)!
    || (poolById.get(x.poolId ?? 0)?.number ?? 0) - (poolById.get(y.poolId ?? 0)?.number ?? 0)
    || (x.orderInPool ?? 0) - (y.orderInPool ?? 0))

  const refs = new Map<number, FighterRef>()
  for (const s of started) for (const [id, ref] of await fighterRefs(db, s.id)) refs.set(id, ref)
  const minutes = new Map(started.map(s => [s.id, estimatedMinutes(s.frozenRules!)]))
  const known = matches.filter(match => match.sideAEntry !== null && match.sideBEntry !== null)
  const input: ScheduleMatch[] = known.map(match => ({
    id: match.id,
    poolId: match.poolId,
    ringId: match.poolId === null ? FINALS_RING : null,
    fighterIds: [refs.get(match.sideAEntry!)!.fighterId, refs.get(match.sideBEntry!)!.fighterId],
    minutes: minutes.get(match.tournamentId)!,
  }))
  const now = Date.now()
  const schedule = planSchedule({
    rings,
    // A ring removed from the event after the draw falls back to the last ring.
    pools: pools.map(pool => ({ id: pool.id, ringId: Math.min(pool.ringNumber, row.rings) })),
    matches: input,
    start: now,
    changeoverMinutes: CHANGEOVER_MINUTES,
    ringChangeMinutes: RING_CHANGE_MINUTES,
  }, {
    now,
    finished: known.filter(match => match.status === 'finished' || match.status === 'forfeit').map(match => match.id),
    underway: known.filter(match => match.status === 'under-way').map(match => ({ id: match.id, startedAt: (match.startedAt ?? new Date(now)).getTime() })),
  })

  const byId = new Map(known.map(match => [match.id, match]))
  const names = new Map(started.map(s => [s.id, s.name]))
  const view = (scheduled: ScheduledMatch) => {
    const match = byId.get(Number(scheduled.id))!
    const side = (entryId: number) => {
      const ref = refs.get(entryId)!
      return { entryId, fighterId: ref.fighterId, name: ref.name, clubName: ref.clubName }
    }
    return {
      ...scheduled,
      matchId: match.id,
      tournamentId: match.tournamentId,
      tournamentName: names.get(match.tournamentId)!,
      stage: match.stage,
      poolNumber: match.poolId === null ? null : poolById.get(match.poolId)!.number,
      bracketKey: match.bracketMatchKey,
      sideA: side(match.sideAEntry!),
      sideB: side(match.sideBEntry!),
      startsAt: new Date(scheduled.start).toISOString(),
      endsAt: new Date(scheduled.end).toISOString(),
    }
  }
  const planned = new Map(schedule.rings.flatMap(ring => ring.matches.map(match => [match.id, match] as const)))
  const fighterNames = new Map([...refs.values()].map(ref => [ref.fighterId, ref.name]))
  const label = (id: ScheduleConflict['matchId']) => {
    const match = planned.get(id)
    if (!match) return `match ${id}`
    const v = view(match)
    return `${v.sideA.name} v ${v.sideB.name} (${v.tournamentName}, ${v.poolNumber === null ? 'finals' : `pool ${v.poolNumber}`})`
  }
  // The planner's messages name ids; the organizer reads names.
  const conflictMessage = (c: ScheduleConflict) => {
    const fighter = c.fighterId === null ? null : fighterNames.get(c.fighterId) ?? `fighter ${c.fighterId}`
    const minutes = `${Math.max(1, Math.round(c.minutes))} min`
    if (c.kind === 'fighter-waits') {
      return `Ring ${c.ringId} waits about ${minutes} for ${fighter} before ${label(c.matchId)}: they fence ${label(c.otherMatchId)} in ring ${c.otherRingId} first.`
    }
    if (c.kind === 'fighter-overlap') {
      return `${fighter} is under way in two rings at once: ${label(c.otherMatchId)} in ring ${c.otherRingId} and ${label(c.matchId)} in ring ${c.ringId}.`
    }
    return `Ring ${c.ringId} has two matches under way at once: ${label(c.otherMatchId)} and ${label(c.matchId)}.`
  }
  const queues = new Map(ringQueues(schedule).map(queue => [queue.ringId, queue]))
  return {
    rings: schedule.rings.map((ring) => {
      const queue = queues.get(ring.ringId)!
      return {
        ...queue,
        now: queue.now && view(queue.now),
        onDeck: queue.onDeck && view(queue.onDeck),
        next: queue.next && view(queue.next),
        // The match under way, then every pending one in the order the ring fences them.
        timeline: ring.matches.map(match => view(match)),
        finished: ring.finished.length,
        end: ring.end === null ? null : new Date(ring.end).toISOString(),
      }
    }),
    conflicts: schedule.conflicts.map(c => ({ ...c, fighterName: c.fighterId === null ? null : fighterNames.get(c.fighterId) ?? null, message: conflictMessage(c) })),
    tournaments: started.map(s => ({ id: s.id, name: s.name, phase: s.phase, matchMinutes: minutes.get(s.id)! })),
    end: schedule.end === null ? null : new Date(schedule.end).toISOString(),
    // The moment the estimates start from.
    at: new Date(now).toISOString(),
    estimates: {
      firstHitMinutesPerBout: FIRST_HIT_MINUTES_PER_BOUT,
      pointsMinutesOverTimeLimit: POINTS_MINUTES_OVER_TIME_LIMIT,
      pointsOpenMinutes: POINTS_OPEN_MINUTES,
      changeoverMinutes: CHANGEOVER_MINUTES,
      ringChangeMinutes: RING_CHANGE_MINUTES,
      finalsRing: FINALS_RING,
    },
  }
})
