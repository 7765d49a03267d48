import { previewEntry } from '#shared/rules'
import { liveSurvival } from '#shared/live/reduce'
import type { MatchEntry, RuleSet, Side } from '#shared/rules'
import type { Board, BoardMode, LiveCard, LiveMatch, LivePool, LiveRecord, RingLive } from '#shared/live/types'

// The ring desk's reads (server/api/clubs/[clubId]/events/[eventId]/rings/…) and the words it shows.

export interface EventRingRow {
  ring: number
  currentMatchId: number | null
  /** Bumped by every call: the desk sends the one it last saw. */
  version: number
  board: { onAir: Board, mode: BoardMode }
  overlay: { path: string, rotatedAt: string | null } | null
}

export interface EventRings {
  event: { id: number, name: string, rings: number }
  rings: EventRingRow[]
}

export function useEventRings(clubId: MaybeRefOrGetter<number>, eventId: MaybeRefOrGetter<number>) {
  return useFetch<EventRings>(() => `/api/clubs/${toValue(clubId)}/events/${toValue(eventId)}/rings`, {
    key: () => `event-rings-${toValue(clubId)}-${toValue(eventId)}`,
  })
}

export function useRingLive(clubId: MaybeRefOrGetter<number>, eventId: MaybeRefOrGetter<number>, ring: MaybeRefOrGetter<number>) {
  return useFetch<RingLive>(() => `/api/clubs/${toValue(clubId)}/events/${toValue(eventId)}/rings/${toValue(ring)}`, {
    key: () => `ring-live-${toValue(clubId)}-${toValue(eventId)}-${toValue(ring)}`,
  })
}

/**
 * Our own figure, not a rule: the desk warns of the last exchange when 10 s or less remain, about
 * the time from the director's call to the halt of one exchange, so the table can tell the director.
 */
export const LAST_EXCHANGE_MS = 10_000

/** "Longsword, pool 2", "Sword and buckler, Semifinal". */
export function matchPlaceText(match: Pick<LiveCard, 'tournamentName' | 'stage' | 'poolNumber' | 'roundName'>): string {
  if (match.stage === 'final') return `${match.tournamentName}, ${match.roundName ?? 'finals'}`
  return `${match.tournamentName}, pool ${match.poolNumber ?? '?'}`
}

/** "Maren Holt v Corin Vale", with a placeholder for a side still to be decided. */
export function pairingText(match: Pick<LiveCard, 'sideA' | 'sideB'>): string {
  return `${match.sideA?.name ?? 'To be decided'} v ${match.sideB?.name ?? 'To be decided'}`
}

/** 2:05, 0:09.4 under ten seconds when `tenths`. */
export function clockText(ms: number, tenths = false): string {
  const clamped = Math.max(0, ms)
  if (tenths && clamped < 10_000) return `0:0${(Math.floor(clamped / 100) / 10).toFixed(1)}`
  const seconds = Math.ceil(clamped / 1000)
  return `${Math.floor(seconds / 60)}:${String(seconds % 60).padStart(2, '0')}`
}

/** What an entry would do to the score, e.g. "+3 / +0 → 4–1 · ends the match". */
export function entryEffect(rules: RuleSet, entries: readonly MatchEntry[], draft: NewMatchEntry): string {
  const { item, state } = previewEntry(rules, entries, { ...draft, id: 'desk-preview' } as MatchEntry)
  if (item.status === 'rejected') return item.problems[0]?.message ?? 'not valid'
  if (item.status !== 'applied') return 'counts for nothing'
  const text = `+${item.points.a} / +${item.points.b} → ${item.score.a}–${item.score.b}`
  return state.finished ? `${text} · ends the match` : text
}

export interface FighterRecordLine {
  label: string
  value: string
}

/**
 * A fighter's pool record as the desk shows it: wins, unharmed bouts of bouts fought and the
 * survival rate with the match on the ring added, and what they still need for the cut.
 */
export function fighterRecord(pool: LivePool | null, match: LiveMatch, side: Side): { lines: FighterRecordLine[], need: string | null } | null {
  if (!pool || match.stage !== 'pool') return null
  const fighter = side === 'a' ? match.sideA : match.sideB
  const record: LiveRecord | undefined = pool.rows.find(r => r.entryId === fighter.entryId)
  if (!record) return null
  const survival = liveSurvival(record, match, side)
  const rate = survival.rate === null ? '–' : `${Math.round(survival.rate * 100)}%`
  const lines = [
    { label: 'Wins', value: `${record.wins} of ${record.matchesFought}` },
    { label: 'Unharmed', value: `${survival.unharmed} / ${survival.fought}` },
    { label: 'Survival', value: rate },
  ]
  let need: string | null = null
  if (record.status === 'secured') need = 'Through to the finals'
  else if (record.status === 'out') need = 'Cannot reach the cut'
  else if (record.status === 'withdrawn' || record.status === 'expelled') need = record.status === 'withdrawn' ? 'Withdrawn' : 'Expelled'
  else if (record.need !== null && pool.cut.minSurvivalRate !== null) {
    need = `Needs ${record.need} more unharmed ${record.need === 1 ? 'bout' : 'bouts'} for the ${Math.round(pool.cut.minSurvivalRate * 100)}% cut`
  }
  else if (pool.cut.topN > 0) need = `Rank ${record.rank}; the top ${pool.cut.topN} go through`
  return { lines, need }
}

/**
 * Keeps an offline copy of the desk pages (public/desk-sw.js): a tablet that reloads while the
 * network is down still opens its desk and the entries waiting in its queue. Without a service
 * worker (an insecure address, an old browser) the queue is kept all the same.
 */
export function useDeskOfflineCopy(slug: MaybeRefOrGetter<string>) {
  onMounted(async () => {
    if (!('serviceWorker' in navigator) || !window.isSecureContext) return
    try {
      const registration = await navigator.serviceWorker.register('/desk-sw.js', { scope: `/clubs/${toValue(slug)}/desk` })
      const worker = registration.active ?? registration.waiting ?? registration.installing
      if (!worker) return
      // This page and what it loaded before the worker took over; later loads pass through it.
      const urls = [location.pathname, ...performance.getEntriesByType('resource').map(e => e.name)
        .filter(name => name.startsWith(`${location.origin}/_nuxt/`))]
      const keep = () => worker.postMessage({ type: 'keep', urls })
      if (worker.state === 'activated') keep()
      else worker.addEventListener('statechange', () => worker.state === 'activated' && keep())
    }
    catch {
      // No offline copy of the page; the queue in localStorage still keeps every entry.
    }
  })
}
