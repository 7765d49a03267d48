import type { TournamentPhase } from '#shared/schemas/tournament'

// The rings of an event: what each fences now and next, and its timeline of matches still to
// fence, estimated from the moment of asking (server/api/clubs/[clubId]/events/[eventId]/schedule.get.ts).

export interface ScheduleFighter { entryId: number, fighterId: number, name: string, clubName: string }

export interface ScheduledMatchView {
  matchId: number
  tournamentId: number
  tournamentName: string
  stage: MatchStage
  poolNumber: number | null
  bracketKey: string | null
  ringId: number
  status: 'underway' | 'pending'
  sideA: ScheduleFighter
  sideB: ScheduleFighter
  startsAt: string
  endsAt: string
}

export interface RingScheduleView {
  ringId: number
  now: ScheduledMatchView | null
  onDeck: ScheduledMatchView | null
  next: ScheduledMatchView | null
  later: number
  /** The match under way, then the pending ones in the order the ring fences them. */
  timeline: ScheduledMatchView[]
  finished: number
  end: string | null
}

export interface ScheduleConflictView {
  kind: 'fighter-waits' | 'fighter-overlap' | 'ring-overlap'
  matchId: number
  ringId: number
  otherMatchId: number
  otherRingId: number
  fighterId: number | null
  fighterName: string | null
  minutes: number
  message: string
}

export interface ScheduleView {
  rings: RingScheduleView[]
  conflicts: ScheduleConflictView[]
  /** The tournaments that have started, with the estimated length of one of their matches. */
  tournaments: { id: number, name: string, phase: TournamentPhase, matchMinutes: number }[]
  end: string | null
  /** The moment the estimates start from. */
  at: string
  estimates: {
    firstHitMinutesPerBout: number
    pointsMinutesOverTimeLimit: number
    pointsOpenMinutes: number
    changeoverMinutes: number
    ringChangeMinutes: number
    finalsRing: number
  }
}

export function useEventSchedule(clubId: MaybeRefOrGetter<number>, eventId: MaybeRefOrGetter<number>) {
  return useFetch<ScheduleView>(() => `/api/clubs/${toValue(clubId)}/events/${toValue(eventId)}/schedule`, {
    key: () => `event-schedule-${toValue(clubId)}-${toValue(eventId)}`,
  })
}

/** "Sword and buckler, pool 2" or "Longsword, finals". */
export function scheduledWhere(match: Pick<ScheduledMatchView, 'tournamentName' | 'stage' | 'poolNumber'>): string {
  return match.stage === 'final' ? `${match.tournamentName}, finals` : `${match.tournamentName}, pool ${match.poolNumber}`
}

/** "1.5" for 1.5 minutes, "4" for 4. */
export function minutesText(minutes: number): string {
  return String(Number(minutes.toFixed(1)))
}
