import { defineStore } from 'pinia'
import {
  acknowledge,
  discardAll,
  emptyQueue,
  enqueue,
  isSettled,
  markSent,
  nextBatch,
  parseQueue,
  QUEUE_PREFIX,
  queueKey,
  refuse,
  resolveConflict,
  retryDelay,
  ringKeyPrefix,
  staleVersion,
  withdraw,
} from '#shared/live/queue'
import type { LogMark, MatchQueue, QueueTarget } from '#shared/live/queue'
import type { MatchEntry, MatchState, RuleSet } from '#shared/rules'
import type { RingLive } from '#shared/live/types'

/** The server's answer to a write, kept for the desk page to fold into what it shows. */
export interface DeskAnswer {
  version: number
  state: MatchState
  /** The entries this answer acknowledged, in the order sent. */
  entries: MatchEntry[]
}

function without<T>(record: Record<string, T>, key: string): Record<string, T> {
  return Object.fromEntries(Object.entries(record).filter(([k]) => k !== key))
}

/** A match's log as the server last answered it, with the state it derived and its rules. */
export interface DeskLog {
  matchId: number
  version: number
  entries: MatchEntry[]
  state: MatchState
  rules: RuleSet
}

/** What the desk last showed of its ring, kept for a reload without network. */
export interface DeskView {
  ring: RingLive
  log: DeskLog | null
}

const viewKey = (scope: Pick<QueueTarget, 'clubId' | 'eventId' | 'ring'>) => `unscathed.desk-view.${scope.clubId}.${scope.eventId}.${scope.ring}`

// A request that hangs this long is given up and sent again (the server stores an id once).
const SEND_TIMEOUT_MS = 15_000

/**
 * The ring desk's outbox: entries the table recorded and the server has not acknowledged, one
 * queue per match, kept in localStorage so that a reload or a dropped connection loses nothing.
 * Queues are sent in order, a match at a time, with the version the desk last saw; a lost answer
 * is repaired by sending the same batch again, which the server answers as duplicates.
 */
export const useDeskStore = defineStore('desk', () => {
  const queues = ref<Record<string, MatchQueue>>({})
  const sending = ref<Record<string, boolean>>({})
  const answers = ref<Record<string, DeskAnswer>>({})
  const online = ref(true)
  /** When the next attempt is due while the server cannot be reached (ms since the epoch), else null. */
  const retryAt = ref<number | null>(null)
  const lastFailure = ref<string | null>(null)
  let attempts = 0
  let timer: ReturnType<typeof setTimeout> | null = null
  let listening = false

  function storage(): Storage | null {
    if (!import.meta.client) return null
    try {
      return window.localStorage
    }
    catch {
      return null
    }
  }

  function put(key: string, q: MatchQueue | null) {
    queues.value = q ? { ...queues.value, [key]: q } : without(queues.value, key)
    const store = storage()
    if (!store) return
    try {
      if (!q || isSettled(q)) store.removeItem(key)
      else store.setItem(key, JSON.stringify(q))
    }
    catch {
      lastFailure.value = 'This browser would not keep the entries on the device (storage full or blocked): keep the connection up until they are sent.'
    }
  }

  function listen() {
    if (listening || !import.meta.client) return
    listening = true
    online.value = navigator.onLine
    window.addEventListener('online', () => {
      online.value = true
      attempts = 0
      void flushAll()
    })
    window.addEventListener('offline', () => {
      online.value = false
    })
    // Another tab of the same desk changed a queue: show what it holds now.
    window.addEventListener('storage', (event) => {
      if (!event.key?.startsWith(`${QUEUE_PREFIX}.`)) return
      const parsed = parseQueue(event.newValue)
      queues.value = parsed ? { ...queues.value, [event.key]: parsed } : without(queues.value, event.key)
    })
  }

  /**
   * Reads the club's queues back from the device (after a reload, or entries left on another
   * ring's desk) and sends what waits.
   */
  function openClub(clubId: number) {
    listen()
    const store = storage()
    if (!store) return
    const prefix = `${QUEUE_PREFIX}.${clubId}.`
    const next = { ...queues.value }
    for (let i = 0; i < store.length; i++) {
      const key = store.key(i)
      if (!key?.startsWith(prefix)) continue
      const parsed = parseQueue(store.getItem(key))
      if (parsed) next[key] = parsed
    }
    queues.value = next
    void flushAll()
  }

  function queueOf(target: Pick<QueueTarget, 'clubId' | 'eventId' | 'ring' | 'matchId'>): MatchQueue | null {
    return queues.value[queueKey(target)] ?? null
  }

  /** The queues of one ring (or of the whole club) that are not settled, oldest match first. */
  function pending(scope: Pick<QueueTarget, 'clubId'> & Partial<Pick<QueueTarget, 'eventId' | 'ring'>>): MatchQueue[] {
    const prefix = scope.eventId !== undefined && scope.ring !== undefined
      ? ringKeyPrefix({ clubId: scope.clubId, eventId: scope.eventId, ring: scope.ring })
      : `${QUEUE_PREFIX}.${scope.clubId}.`
    return Object.entries(queues.value)
      .filter(([key, q]) => key.startsWith(prefix) && !isSettled(q))
      .map(([, q]) => q)
      .sort((x, y) => x.matchId - y.matchId)
  }

  /** Queues an entry the table recorded on the match as it saw it (`seen`), and sends it. */
  function record(target: QueueTarget, entry: MatchEntry, seen: LogMark) {
    const key = queueKey(target)
    const q = queues.value[key] ?? emptyQueue(target, seen)
    put(key, enqueue({ ...q, label: target.label }, entry, seen))
    void flush(key)
  }

  /** Takes back an entry before it is sent. False when it is already on its way. */
  function takeBack(target: Pick<QueueTarget, 'clubId' | 'eventId' | 'ring' | 'matchId'>, id: string): boolean {
    const key = queueKey(target)
    const q = queues.value[key]
    if (!q) return false
    const next = withdraw(q, id)
    if (next === q) return false
    put(key, next)
    return true
  }

  function resolve(key: string, choice: 'send' | 'discard') {
    const q = queues.value[key]
    if (!q) return
    put(key, resolveConflict(q, choice))
    void flush(key)
  }

  function discard(key: string) {
    const q = queues.value[key]
    if (q) put(key, discardAll(q))
  }

  function keepView(scope: Pick<QueueTarget, 'clubId' | 'eventId' | 'ring'>, view: DeskView) {
    try {
      storage()?.setItem(viewKey(scope), JSON.stringify(view))
    }
    catch {
      // Only a convenience for reloads without network: the queue itself is kept separately.
    }
  }

  function keptView(scope: Pick<QueueTarget, 'clubId' | 'eventId' | 'ring'>): DeskView | null {
    try {
      const view = JSON.parse(storage()?.getItem(viewKey(scope)) ?? 'null') as DeskView | null
      return view && typeof view.ring?.seq === 'number' && view.ring.ring === scope.ring ? view : null
    }
    catch {
      return null
    }
  }

  function scheduleRetry() {
    if (!import.meta.client) return
    if (timer) clearTimeout(timer)
    const delay = retryDelay(attempts++)
    retryAt.value = Date.now() + delay
    timer = setTimeout(() => {
      timer = null
      retryAt.value = null
      void flushAll()
    }, delay)
  }

  async function flushAll() {
    await Promise.all(Object.keys(queues.value).map(key => flush(key)))
  }

  async function flush(key: string): Promise<void> {
    if (!import.meta.client || sending.value[key]) return
    // The browser knows it has no network: wait for its `online` event rather than mark a batch as sent.
    if (!navigator.onLine) {
      online.value = false
      return
    }
    const q = queues.value[key]
    const batch = q ? nextBatch(q) : null
    if (!q || !batch) return
    sending.value = { ...sending.value, [key]: true }
    put(key, markSent(q, batch.ids))
    const url = `/api/clubs/${q.clubId}/events/${q.eventId}/tournaments/${q.tournamentId}/matches/${q.matchId}/entries`
    let again = false
    try {
      const answer = await $fetch<{ match: { version: number }, state: MatchState }>(url, {
        method: 'POST',
        body: { expectedVersion: batch.expectedVersion, entries: batch.entries },
        timeout: SEND_TIMEOUT_MS,
      })
      attempts = 0
      lastFailure.value = null
      const current = queues.value[key]
      if (current) put(key, acknowledge(current, { version: answer.match.version, ids: answer.state.timeline.map(i => i.id) }))
      answers.value = { ...answers.value, [key]: { version: answer.match.version, state: answer.state, entries: batch.entries } }
      again = true
    }
    catch (err) {
      const current = queues.value[key]
      const status = apiStatus(err)
      const data = (err as { data?: { data?: { fields?: Record<string, string>, state?: MatchState, match?: { version: number } } } }).data?.data
      if (!current) {
        // Discarded while the request was out.
      }
      else if (status === 409 && data?.fields?.expectedVersion && data.state && data.match) {
        put(key, staleVersion(current, { version: data.match.version, ids: data.state.timeline.map(i => i.id) }))
        // Straight on with the new version, unless the server named the one just sent (then wait a moment).
        if (data.match.version !== batch.expectedVersion) again = true
        else scheduleRetry()
      }
      else if (status === undefined || status >= 500 || status === 408 || status === 429) {
        lastFailure.value = status === undefined ? 'The server cannot be reached.' : `The server answered ${status}.`
        scheduleRetry()
      }
      else if (status === 401) {
        lastFailure.value = 'You are signed out: sign in again in another tab and the entries are sent; they are kept here meanwhile.'
        scheduleRetry()
      }
      else {
        put(key, refuse(current, apiErrorMessage(err, 'The server refused the entries.')))
      }
    }
    finally {
      sending.value = without(sending.value, key)
    }
    if (again) await flush(key)
  }

  return {
    queues,
    sending,
    answers,
    online,
    retryAt,
    lastFailure,
    openClub,
    queueOf,
    pending,
    record,
    takeBack,
    resolve,
    discard,
    keepView,
    keptView,
    flush,
    flushAll,
  }
})
