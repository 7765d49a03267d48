import type { ServerResponse } from 'node:http'
import type { Socket } from 'node:net'
import { and, asc, desc, eq, gt, lte, sql } from 'drizzle-orm'
import pg from 'pg'
import type { LiveMessage } from '#shared/live/types'

// The reading side of the live bus, one per app process. It LISTENs on PostgreSQL, so every
// process hears every ring's messages whichever process wrote them, and writes each message once
// as bytes to all of its own clients' responses. A client that reconnects with Last-Event-ID
// gets what it missed from live_events first. The same hub makes the rings' snapshots: whichever
// process sees a ring marked first takes it (an advisory lock), the others skip it.

/** What a client follows: one ring (the overlay), or every ring of the event. */
type Scope = { kind: 'ring', ring: number } | { kind: 'event', rings: readonly number[] }

interface Subscriber {
  eventId: number
  scope: Scope
  res: ServerResponse
  /** Messages go straight to the socket: the same bytes for every client, one write each. */
  socket: Socket
  /** The last message sent, per ring. */
  positions: Map<number, number>
  /** Live messages that arrived while the backlog was being sent. */
  waiting: { ring: number, seq: number, body: string, kind: string }[] | null
  /** The overlay token the stream was opened with, to close it when the token is rotated. */
  token: string | null
  /** Since when (ms) its unsent data has stayed above the limit. */
  slowSince: number | null
}

// A client whose unsent data stays above this for SLOW_MS is too slow to follow and is dropped;
// one above HARD_LIMIT_BYTES at once, too (a replay may briefly queue a lot for a good client).
const MAX_BUFFERED_BYTES = 512 * 1024
const SLOW_MS = 5_000
const HARD_LIMIT_BYTES = 32 * 1024 * 1024
// Proxies and browsers close a stream that stays silent for long; a comment line every 15 s keeps it open.
const HEARTBEAT_MS = 15_000
const SWEEP_MS = 2_000
// A ring's snapshot waits for the changes to pause this long, and never longer than the other.
const SNAPSHOT_QUIET_MS = 100
const SNAPSHOT_MAX_WAIT_MS = 5000
// Messages kept per ring beyond its latest snapshot, for clients that reconnect.
const KEEP_MESSAGES = 500
const RETRY = Buffer.from('retry: 1000\n\n')
const HEARTBEAT = Buffer.from(': keep-alive\n\n')

/** The id of a message on an event stream: every ring's position, e.g. `1:12,2:7`. */
export function eventStreamId(positions: ReadonlyMap<number, number>): string {
  return [...positions].sort((x, y) => x[0] - y[0]).map(([ring, seq]) => `${ring}:${seq}`).join(',')
}

/** Positions from a Last-Event-ID: a ring stream's number, or an event stream's list. Unknown input means none. */
export function parseLastEventId(value: string | undefined | null, scope: Scope): Map<number, number> {
  const positions = new Map<number, number>()
  if (!value || value.length > 400) return positions
  if (scope.kind === 'ring') {
    if (/^\d{1,9}$/.test(value)) positions.set(scope.ring, Number(value))
    return positions
  }
  for (const part of value.split(',')) {
    const match = /^(\d{1,2}):(\d{1,9})$/.exec(part)
    if (match && scope.rings.includes(Number(match[1]))) positions.set(Number(match[1]), Number(match[2]))
  }
  return positions
}

function frame(id: string, kind: string, body: string): Buffer {
  return Buffer.from(`id: ${id}\nevent: ${kind}\ndata: ${body}\n\n`)
}

export class LiveHub {
  private subscribers = new Map<number, Set<Subscriber>>()
  /** The last message handed to clients, per `event:ring`, to notice a gap. */
  private delivered = new Map<string, number>()
  private listener: pg.Client | null = null
  private listening: Promise<void> | null = null
  private timers: ReturnType<typeof setInterval>[] = []
  private sweeping = false
  private sweepAgain = false
  private sweepTimer: ReturnType<typeof setTimeout> | null = null
  private sweepDue: number | null = null
  private closed = false
  private chains = new Map<string, Promise<void>>()

  private readonly heartbeatMs: number
  private readonly maxBuffered: number
  private readonly slowMs: number
  private readonly snapshots: boolean

  /**
   * `snapshots: false` leaves the rings' snapshots to a worker process (UNSCATHED_ROLE=worker), so
   * that an app process spends its time on requests and on passing messages on.
   */
  constructor(private readonly databaseUrl: string, options: { heartbeatMs?: number, maxBufferedBytes?: number, slowMs?: number, snapshots?: boolean } = {}) {
    this.heartbeatMs = options.heartbeatMs ?? HEARTBEAT_MS
    this.maxBuffered = options.maxBufferedBytes ?? MAX_BUFFERED_BYTES
    this.slowMs = options.slowMs ?? SLOW_MS
    this.snapshots = options.snapshots ?? true
  }

  /** Starts listening and the periodic work; safe to call more than once. */
  start(): Promise<void> {
    if (!this.listening) {
      this.listening = this.connect()
      this.timers.push(setInterval(() => this.heartbeat(), this.heartbeatMs))
      if (this.snapshots) this.timers.push(setInterval(() => void this.sweep(), SWEEP_MS))
      this.timers.push(setInterval(() => this.dropSlow(), Math.min(1000, this.slowMs)))
      for (const timer of this.timers) timer.unref()
    }
    return this.listening
  }

  async stop() {
    this.closed = true
    for (const timer of this.timers) clearInterval(timer)
    if (this.sweepTimer) clearTimeout(this.sweepTimer)
    for (const set of this.subscribers.values()) for (const sub of set) sub.socket.end()
    this.subscribers.clear()
    await this.listener?.end().catch(() => {})
  }

  private async connect(): Promise<void> {
    const client = new pg.Client({ connectionString: this.databaseUrl })
    client.on('error', (err) => {
      console.error('[live] listener lost:', err.message)
      this.reconnect(client)
    })
    client.on('end', () => this.reconnect(client))
    client.on('notification', (n) => {
      if (n.channel === LIVE_CHANNEL) this.onMessage(n.payload ?? '')
      else if (n.channel === DIRTY_CHANNEL && this.snapshots) this.requestSweep()
      else if (n.channel === TOKEN_CHANNEL) this.onTokenRotated(n.payload ?? '')
    })
    await client.connect()
    await client.query(`listen ${LIVE_CHANNEL}; listen ${DIRTY_CHANNEL}; listen ${TOKEN_CHANNEL}`)
    this.listener = client
    // Whatever was published while nobody listened.
    for (const [eventId, set] of this.subscribers) {
      const rings = new Set([...set].flatMap(s => (s.scope.kind === 'ring' ? [s.scope.ring] : s.scope.rings)))
      for (const ring of rings) this.catchUp(eventId, ring, null)
    }
    if (this.snapshots) void this.sweep()
  }

  private reconnect(client: pg.Client) {
    if (this.closed || this.listener !== client) return
    this.listener = null
    const retry = () => {
      if (this.closed) return
      this.listening = this.connect().catch((err: Error) => {
        console.error('[live] listener reconnect failed:', err.message)
        setTimeout(retry, 1000).unref()
      })
    }
    setTimeout(retry, 200).unref()
  }

  // ——— fan-out ———

  private onMessage(payload: string) {
    // eventId:ring:seq:kind[:json] — the JSON itself may hold colons.
    const cuts: number[] = []
    for (let i = 0, at = -1; i < 4; i++) {
      at = payload.indexOf(':', at + 1)
      cuts.push(at < 0 ? payload.length : at)
    }
    const eventId = Number(payload.slice(0, cuts[0]))
    const ring = Number(payload.slice(cuts[0]! + 1, cuts[1]))
    const seq = Number(payload.slice(cuts[1]! + 1, cuts[2]))
    const kind = payload.slice(cuts[2]! + 1, cuts[3])
    const body = cuts[3]! < payload.length ? payload.slice(cuts[3]! + 1) : null
    const key = `${eventId}:${ring}`
    if (!this.subscribers.has(eventId)) {
      this.delivered.set(key, seq)
      return
    }
    const last = this.delivered.get(key)
    if (body !== null && (last === undefined || seq === last + 1)) {
      this.delivered.set(key, seq)
      this.deliver(eventId, ring, seq, kind, body)
    }
    else {
      this.catchUp(eventId, ring, seq)
    }
  }

  /** Reads a ring's messages after the last delivered one from the database, in order, one read at a time per ring. */
  private catchUp(eventId: number, ring: number, upTo: number | null) {
    const key = `${eventId}:${ring}`
    const previous = this.chains.get(key) ?? Promise.resolve()
    const next = previous.then(async () => {
      const after = this.delivered.get(key) ?? 0
      if (upTo !== null && upTo <= after) return
      const l = schema.liveEvents
      const rows = await useDb().select({ seq: l.seq, kind: l.kind, payload: l.payload }).from(l)
        .where(and(eq(l.eventId, eventId), eq(l.ringNumber, ring), gt(l.seq, after))).orderBy(asc(l.seq))
      for (const row of rows) {
        if (row.seq <= (this.delivered.get(key) ?? 0)) continue
        this.delivered.set(key, row.seq)
        this.deliver(eventId, ring, row.seq, row.kind, JSON.stringify(row.payload))
      }
    }).catch((err: Error) => console.error('[live] catch-up failed:', err.message))
    this.chains.set(key, next)
    void next.finally(() => {
      if (this.chains.get(key) === next) this.chains.delete(key)
    })
  }

  private deliver(eventId: number, ring: number, seq: number, kind: string, body: string) {
    const set = this.subscribers.get(eventId)
    if (!set) return
    // One buffer for every overlay of the ring; event streams carry every ring's position in
    // their id, and the clients that are up to date share one buffer for it too.
    let ringFrame: Buffer | null = null
    let frames: Map<string, Buffer> | null = null
    for (const sub of set) {
      if (sub.scope.kind === 'ring' ? sub.scope.ring !== ring : !sub.scope.rings.includes(ring)) continue
      if (sub.waiting) {
        sub.waiting.push({ ring, seq, kind, body })
        continue
      }
      if ((sub.positions.get(ring) ?? 0) >= seq) continue
      sub.positions.set(ring, seq)
      if (sub.scope.kind === 'ring') {
        ringFrame ??= frame(String(seq), kind, body)
        this.write(sub, ringFrame)
      }
      else {
        const id = eventStreamId(sub.positions)
        frames ??= new Map()
        let shared = frames.get(id)
        if (!shared) frames.set(id, shared = frame(id, kind, body))
        this.write(sub, shared)
      }
    }
  }

  private write(sub: Subscriber, bytes: Buffer) {
    const socket = sub.socket
    if (socket.destroyed || socket.writableEnded) return
    if (socket.writableLength > HARD_LIMIT_BYTES) {
      this.drop(sub)
      return
    }
    socket.write(bytes)
  }

  /** A client that cannot take what it is sent goes; the server and the other clients carry on. */
  private drop(sub: Subscriber) {
    this.unsubscribe(sub)
    sub.socket.destroy()
  }

  private dropSlow() {
    const now = Date.now()
    for (const set of this.subscribers.values()) {
      for (const sub of set) {
        if (sub.socket.writableLength <= this.maxBuffered) {
          sub.slowSince = null
          continue
        }
        sub.slowSince ??= now
        if (now - sub.slowSince >= this.slowMs) this.drop(sub)
      }
    }
  }

  private heartbeat() {
    for (const set of this.subscribers.values()) for (const sub of set) if (!sub.waiting) this.write(sub, HEARTBEAT)
  }

  private onTokenRotated(payload: string) {
    const [eventId, ring] = payload.split(':').map(Number)
    for (const sub of this.subscribers.get(eventId!) ?? []) {
      if (sub.token !== null && sub.scope.kind === 'ring' && sub.scope.ring === ring) {
        this.unsubscribe(sub)
        sub.socket.end()
      }
    }
  }

  // ——— clients ———

  /**
   * Streams a ring or an event to one response: headers, the backlog after `positions` (or, for a
   * ring without a position, its latest snapshot and what followed it), then every new message,
   * each exactly once. Resolves when the client goes away.
   */
  async stream(res: ServerResponse, eventId: number, scope: Scope, positions: Map<number, number>, token: string | null = null): Promise<void> {
    await this.start()
    const socket = res.socket
    if (!socket) return
    // No chunked framing: the body runs until the connection closes, as a stream of events may,
    // and every client gets exactly the bytes of a message, written once to its socket.
    res.removeHeader('transfer-encoding')
    res.writeHead(200, {
      'content-type': 'text/event-stream; charset=utf-8',
      'cache-control': 'no-cache, no-transform',
      'connection': 'close',
      'x-accel-buffering': 'no',
    })
    res.flushHeaders()
    socket.setNoDelay(true)
    socket.write(RETRY)
    const sub: Subscriber = { eventId, scope, res, socket, positions: new Map(positions), waiting: [], token, slowSince: null }
    let set = this.subscribers.get(eventId)
    if (!set) this.subscribers.set(eventId, set = new Set())
    set.add(sub)
    const closed = new Promise<void>(resolve => res.on('close', resolve))
    void closed.then(() => this.unsubscribe(sub))

    try {
      const rings = scope.kind === 'ring' ? [scope.ring] : scope.rings
      for (const ring of rings) {
        const { rows, reset } = await this.backlog(eventId, ring, positions.get(ring) ?? null)
        if (reset) sub.positions.delete(ring)
        for (const row of rows) this.send(sub, ring, row.seq, row.kind, JSON.stringify(row.payload))
      }
      const queued = sub.waiting ?? []
      sub.waiting = null
      for (const item of queued) this.send(sub, item.ring, item.seq, item.kind, item.body)
    }
    catch (err) {
      console.error('[live] backlog failed:', (err as Error).message)
      this.unsubscribe(sub)
      socket.destroy()
    }
    return closed
  }

  private send(sub: Subscriber, ring: number, seq: number, kind: string, body: string) {
    if ((sub.positions.get(ring) ?? 0) >= seq) return
    sub.positions.set(ring, seq)
    const id = sub.scope.kind === 'ring' ? String(seq) : eventStreamId(sub.positions)
    this.write(sub, frame(id, kind, body))
  }

  private unsubscribe(sub: Subscriber) {
    const set = this.subscribers.get(sub.eventId)
    if (!set) return
    set.delete(sub)
    if (set.size === 0) this.subscribers.delete(sub.eventId)
  }

  /**
   * What a client joining at `after` must be sent for one ring: what followed `after`, or from the
   * latest snapshot when it has no position, one older than what is kept, or one this ring never
   * reached (`reset`).
   */
  private async backlog(eventId: number, ring: number, after: number | null): Promise<{ rows: LiveRow[], reset: boolean }> {
    const l = schema.liveEvents
    const db = useDb()
    const here = and(eq(l.eventId, eventId), eq(l.ringNumber, ring))
    const [latest] = await db.select({ seq: l.seq }).from(l).where(and(here, eq(l.kind, 'ring'))).orderBy(desc(l.seq)).limit(1)
    if (!latest) {
      // A ring nobody has followed yet: make its first snapshot now.
      if (await this.publishSnapshot(eventId, ring)) return this.backlog(eventId, ring, after)
      await new Promise(resolve => setTimeout(resolve, 50))
      return this.backlog(eventId, ring, after)
    }
    let from = latest.seq
    let reset = true
    if (after !== null) {
      const [range] = await db.select({ oldest: sql<number>`min(${l.seq})`, newest: sql<number>`max(${l.seq})` }).from(l).where(here)
      if (after >= Number(range!.oldest) - 1 && after <= Number(range!.newest)) {
        from = after + 1
        reset = false
      }
    }
    const rows = await db.select({ seq: l.seq, kind: l.kind, payload: l.payload }).from(l)
      .where(and(here, gt(l.seq, from - 1))).orderBy(asc(l.seq))
    return { rows, reset }
  }

  // ——— snapshots ———

  /**
   * Makes and sends the ring's snapshot, unless another process is making it right now. The data
   * is read without holding up the ring's desk; when a change landed meanwhile (a message, or a
   * new mark), it is read again once the ring's row is locked, so that a snapshot never carries a
   * number later than its data. Clears the marks it has seen.
   */
  async publishSnapshot(eventId: number, ring: number): Promise<boolean> {
    return useDb().transaction(async (tx) => {
      const [{ locked } = { locked: false }] = (await tx.execute<{ locked: boolean }>(
        sql`select pg_try_advisory_xact_lock(${LIVE_LOCK_SPACE}, ${eventId * 16 + ring}) as locked`)).rows
      if (!locked) return false
      const d = schema.liveDirty
      const here = and(eq(d.eventId, eventId), eq(d.ringNumber, ring))
      // The mark's time as text keeps its microseconds, so that a newer mark is never cleared by mistake.
      const markNow = async () => (await tx.select({ at: sql<string>`${d.markedAt}::text` }).from(d).where(here))[0]?.at ?? null
      const seen = { seq: (await ringState(tx, eventId, ring)).seq, mark: await markNow() }
      let snapshot = await ringSnapshot(tx, eventId, ring)
      const state = await ringState(tx, eventId, ring, { lock: true })
      const mark = await markNow()
      if (state.seq !== seen.seq || mark !== seen.mark) {
        seen.mark = mark
        snapshot = await ringSnapshot(tx, eventId, ring)
      }
      snapshot.seq = state.seq + 1
      snapshot.at = new Date().toISOString()
      await publishLive(tx, eventId, ring, { kind: 'ring', ring, snapshot }, { dirty: false })
      if (seen.mark !== null) await tx.delete(d).where(and(here, sql`${d.markedAt} <= ${seen.mark}::timestamptz`))
      const l = schema.liveEvents
      await tx.delete(l).where(and(eq(l.eventId, eventId), eq(l.ringNumber, ring), lte(l.seq, snapshot.seq - KEEP_MESSAGES)))
      return true
    })
  }

  /**
   * Sweeps once the marks have been quiet for a moment, and at the latest five seconds after
   * the first: a bout every few seconds gets its own snapshot, a burst (a result entered after the
   * fact, a busy ring) makes one.
   */
  private requestSweep() {
    const now = Date.now()
    this.sweepDue ??= now + SNAPSHOT_MAX_WAIT_MS
    if (this.sweepTimer) clearTimeout(this.sweepTimer)
    this.sweepTimer = setTimeout(() => {
      this.sweepTimer = null
      this.sweepDue = null
      void this.sweep()
    }, Math.max(0, Math.min(SNAPSHOT_QUIET_MS, this.sweepDue - now)))
  }

  /** Makes a snapshot for every ring marked out of date, oldest first. One sweep at a time per process. */
  async sweep(): Promise<void> {
    if (this.sweeping) {
      this.sweepAgain = true
      return
    }
    this.sweeping = true
    try {
      do {
        this.sweepAgain = false
        const d = schema.liveDirty
        const rows = await useDb().select({ eventId: d.eventId, ringNumber: d.ringNumber })
          .from(d).orderBy(asc(d.markedAt)).limit(50)
        for (const row of rows) {
          await this.publishSnapshot(row.eventId, row.ringNumber).catch((err: Error) => {
            console.error(`[live] snapshot of event ${row.eventId} ring ${row.ringNumber} failed:`, err.message)
          })
        }
        if (rows.length === 50) this.sweepAgain = true
      } while (this.sweepAgain && !this.closed)
    }
    finally {
      this.sweeping = false
    }
  }

  /** Clients connected to this process, for tests and the operations page. */
  get clientCount(): number {
    let n = 0
    for (const set of this.subscribers.values()) n += set.size
    return n
  }
}

// The first key of the advisory locks that claim a ring's snapshot.
const LIVE_LOCK_SPACE = 7301

/**
 * What this process does: `web` answers requests and passes live messages on, `worker` does the
 * background work (the rings' snapshots), `all` (the default, one process alone) both.
 */
export function serverRole(): 'web' | 'worker' | 'all' {
  const role = process.env.UNSCATHED_ROLE
  return role === 'web' || role === 'worker' ? role : 'all'
}

let hub: LiveHub | null = null

/** The live hub of this process. */
export function useLiveHub(): LiveHub {
  // These settings are for tests (and for operators behind an unusual proxy); see .env.example.
  const number = (value: string | undefined) => (value && /^\d+$/.test(value) ? Number(value) : undefined)
  hub ??= new LiveHub(useRuntimeConfig().databaseUrl, {
    heartbeatMs: number(process.env.UNSCATHED_LIVE_HEARTBEAT_MS),
    maxBufferedBytes: number(process.env.UNSCATHED_LIVE_MAX_BUFFER),
    slowMs: number(process.env.UNSCATHED_LIVE_SLOW_MS),
    snapshots: serverRole() !== 'web',
  })
  return hub
}

export type { Scope as LiveScope }
export type LiveRow = { seq: number, kind: LiveMessage['kind'], payload: LiveMessage }
