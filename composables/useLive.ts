import { applyLive, learnOffset } from '#shared/live/reduce'
import type { LiveKind, LiveMessage, RingLive } from '#shared/live/types'

export type LiveStatus = 'connecting' | 'live' | 'reconnecting' | 'gone'

const KINDS: readonly LiveKind[] = ['ring', 'match', 'board']

/**
 * Follows a live stream (server/routes/live/…) in the browser: every ring's state folded from the
 * messages by the shared reducer, the connection's status, and the offset of the server's clock.
 * EventSource reconnects by itself and resumes from the last message (Last-Event-ID); when the
 * server refuses the stream (a rotated overlay token, an unpublished event) `check` says whether
 * to try again, and the status becomes `gone` when it says no.
 */
export function useLiveStream(url: MaybeRefOrGetter<string | null>, options: { check?: () => Promise<boolean> } = {}) {
  const rings = ref(new Map<number, RingLive>())
  const status = ref<LiveStatus>('connecting')
  // Server time minus this browser's time, in ms, from the latest message.
  const offset = ref(0)
  let synced = false
  let source: EventSource | null = null
  let retry: ReturnType<typeof setTimeout> | null = null
  let lastId: string | null = null
  let attempts = 0
  let stopped = false

  function onMessage(event: MessageEvent<string>) {
    const message = JSON.parse(event.data) as LiveMessage
    if (event.lastEventId) lastId = event.lastEventId
    attempts = 0
    status.value = 'live'
    syncClock(message.kind === 'ring' ? message.snapshot.at : message.at)
    const next = applyLive(rings.value.get(message.ring) ?? null, message)
    if (next && next !== rings.value.get(message.ring)) {
      const copy = new Map(rings.value)
      copy.set(message.ring, next)
      rings.value = copy
    }
  }

  function close() {
    source?.close()
    source = null
    if (retry) clearTimeout(retry)
    retry = null
  }

  function open() {
    const base = toValue(url)
    if (!base || stopped) return
    close()
    // EventSource sends Last-Event-ID itself when it reconnects; a new EventSource carries it in the query.
    const full = lastId ? `${base}${base.includes('?') ? '&' : '?'}lastEventId=${encodeURIComponent(lastId)}` : base
    source = new EventSource(full)
    source.addEventListener('open', () => {
      status.value = 'live'
    })
    for (const kind of KINDS) source.addEventListener(kind, onMessage as EventListener)
    source.addEventListener('error', () => {
      if (!source || source.readyState !== EventSource.CLOSED) {
        status.value = 'reconnecting'
        return
      }
      // Refused (not a network error): ask whether the stream still exists before trying again.
      close()
      status.value = 'reconnecting'
      const delay = Math.min(10_000, 500 * 2 ** attempts++)
      retry = setTimeout(async () => {
        const again = options.check ? await options.check().catch(() => true) : true
        if (again) open()
        else status.value = 'gone'
      }, delay)
    })
  }

  if (import.meta.client) {
    onMounted(open)
    onBeforeUnmount(() => {
      stopped = true
      close()
    })
    watch(() => toValue(url), () => {
      lastId = null
      rings.value = new Map()
      status.value = 'connecting'
      open()
    })
  }

  /** Learns the server's clock from a time the server stamped (see `learnOffset`). */
  function syncClock(at: string) {
    offset.value = learnOffset(synced ? offset.value : null, at, Date.now())
    synced = true
  }

  /** The server's time now, in ms. */
  const serverNow = () => Date.now() + offset.value
  return { rings, status, offset, serverNow, syncClock, reconnect: open }
}
