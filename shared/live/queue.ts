// The ring desk's outbox: entries recorded at the table and not yet acknowledged by the server,
// one queue per match. Pure: the store (stores/desk.ts) keeps the queues in localStorage, sends
// them and feeds the answers back here. Not imported by the boards (it brings zod with the
// entry schema).
import { matchEntrySchema } from '../rules/entries'
import type { MatchEntry } from '../rules/entries'

/** Where a match's entries go, and what the notices call it. */
export interface QueueTarget {
  clubId: number
  eventId: number
  ring: number
  tournamentId: number
  matchId: number
  /** "Maren Holt v Corin Vale". */
  label: string
}

/** The server's log as the desk saw it: its version and how many entries it held. */
export interface LogMark {
  version: number
  length: number
}

export interface MatchQueue extends QueueTarget {
  /**
   * The match as the desk saw it when the first waiting entry was recorded. It moves on only
   * with this desk's own writes, so a change made by another desk meanwhile shows as a conflict.
   */
  base: LogMark
  entries: MatchEntry[]
  /** Ids of the batch sent last and not answered yet: it is sent again alone before anything else. */
  inflight: string[] | null
  /** Another desk changed the match: the table sends its entries on top or discards them. */
  conflict: (LogMark & { at: string }) | null
  /** The server refused the entries for a reason no resend mends (the match is over, an entry is not valid). */
  refused: { message: string, at: string } | null
}

/** What the server answered: the match's version and the ids of its whole log, in order. */
export interface ServerLog {
  version: number
  ids: readonly string[]
}

/** The start of every queue's localStorage key. */
export const QUEUE_PREFIX = 'unscathed.desk'

/** The localStorage key of one match's queue. */
export function queueKey(t: Pick<QueueTarget, 'clubId' | 'eventId' | 'ring' | 'matchId'>): string {
  return `${ringKeyPrefix(t)}${t.matchId}`
}

/** The start of the keys of every queue of one ring. */
export function ringKeyPrefix(t: Pick<QueueTarget, 'clubId' | 'eventId' | 'ring'>): string {
  return `${QUEUE_PREFIX}.${t.clubId}.${t.eventId}.${t.ring}.`
}

export function emptyQueue(target: QueueTarget, seen: LogMark): MatchQueue {
  return { ...target, base: { ...seen }, entries: [], inflight: null, conflict: null, refused: null }
}

/** True when nothing waits, nothing is on its way and nothing needs the table. */
export function isSettled(q: MatchQueue): boolean {
  return q.entries.length === 0 && q.inflight === null && q.conflict === null && q.refused === null
}

/**
 * Adds an entry. An empty queue takes the match as the desk shows it now (`seen`) as its base; a
 * queue with entries waiting keeps its base, so they all go with the version they were recorded on.
 */
export function enqueue(q: MatchQueue, entry: MatchEntry, seen: LogMark): MatchQueue {
  const base = isSettled(q) ? { ...seen } : q.base
  return { ...q, base, entries: [...q.entries, entry] }
}

/** Takes back an entry that has not been sent; one on its way cannot be (the server may hold it). */
export function withdraw(q: MatchQueue, id: string): MatchQueue {
  if (q.inflight?.includes(id) || !q.entries.some(e => e.id === id)) return q
  return { ...q, entries: q.entries.filter(e => e.id !== id) }
}

export function canWithdraw(q: MatchQueue | null | undefined, id: string): boolean {
  return Boolean(q && !q.inflight?.includes(id) && q.entries.some(e => e.id === id))
}

/**
 * The next request: the batch on its way again if its answer was lost (the same ids, so the server
 * answers it as duplicates), else every waiting entry up to `max`, in the order recorded. Null when
 * there is nothing to send or the table must decide first.
 */
export function nextBatch(q: MatchQueue, max = 100): { ids: string[], entries: MatchEntry[], expectedVersion: number } | null {
  if (q.conflict || q.refused || q.entries.length === 0) return null
  const entries = q.inflight ? q.entries.filter(e => q.inflight!.includes(e.id)) : q.entries.slice(0, max)
  if (entries.length === 0) return null
  return { ids: entries.map(e => e.id), entries, expectedVersion: q.base.version }
}

export function markSent(q: MatchQueue, ids: string[]): MatchQueue {
  return { ...q, inflight: [...ids] }
}

/**
 * Folds what the server holds into the queue: waiting entries it already has are done. When the
 * log grew by more than this desk's own entries since the base, another desk wrote to the match,
 * and the entries still waiting are held for the table to decide (`conflict`); otherwise (only this
 * desk's entries, or a change without entries such as the clock) the queue moves its base on.
 */
function settle(q: MatchQueue, server: ServerLog, at: string): MatchQueue {
  const held = new Set(server.ids)
  const ours = q.entries.filter(e => held.has(e.id)).length
  const entries = q.entries.filter(e => !held.has(e.id))
  const foreign = server.ids.length - q.base.length - ours > 0
  const mark = { version: server.version, length: server.ids.length }
  if (entries.length > 0 && foreign) return { ...q, entries, inflight: null, conflict: { ...mark, at } }
  return { ...q, entries, inflight: null, conflict: null, base: mark }
}

/** 201 or 200: the batch is stored (or was already). */
export function acknowledge(q: MatchQueue, server: ServerLog, at = new Date().toISOString()): MatchQueue {
  return settle(q, server, at)
}

/** 409 on the version: the match moved on since the base. */
export function staleVersion(q: MatchQueue, server: ServerLog, at = new Date().toISOString()): MatchQueue {
  return settle(q, server, at)
}

/** Another refusal: kept until the table discards the entries. */
export function refuse(q: MatchQueue, message: string, at = new Date().toISOString()): MatchQueue {
  return { ...q, inflight: null, refused: { message, at } }
}

/** The table's answer to a conflict: its entries go on top of the match as it is now, or are dropped. */
export function resolveConflict(q: MatchQueue, choice: 'send' | 'discard'): MatchQueue {
  if (!q.conflict) return q
  const base = { version: q.conflict.version, length: q.conflict.length }
  if (choice === 'discard') return { ...q, base, entries: [], inflight: null, conflict: null, refused: null }
  return { ...q, base, conflict: null }
}

/** Drops every waiting entry (after a refusal, or when the table says so). */
export function discardAll(q: MatchQueue): MatchQueue {
  return { ...q, entries: [], inflight: null, conflict: null, refused: null }
}

/** Waits between attempts while the server cannot be reached: 1 s, 2 s, 4 s … at most 30 s. */
export function retryDelay(attempt: number): number {
  return Math.min(30_000, 1000 * 2 ** Math.max(0, Math.min(attempt, 15)))
}

const isCount = (v: unknown): v is number => typeof v === 'number' && Number.isInteger(v) && v >= 0
const isId = (v: unknown): v is number => isCount(v) && v > 0
const isMark = (v: unknown): v is LogMark => typeof v === 'object' && v !== null
  && isCount((v as LogMark).version) && isCount((v as LogMark).length)

/**
 * A queue read back from storage, or null when the text is not one (an older format, a hand edit):
 * entries are checked by the engine's own schema, and the queue is dropped only when they all fail.
 */
export function parseQueue(text: string | null): MatchQueue | null {
  if (!text) return null
  let raw: unknown
  try {
    raw = JSON.parse(text)
  }
  catch {
    return null
  }
  if (typeof raw !== 'object' || raw === null) return null
  const r = raw as Record<string, unknown>
  if (!isId(r.clubId) || !isId(r.eventId) || !isId(r.ring) || !isId(r.tournamentId) || !isId(r.matchId) || !isMark(r.base)) return null
  if (!Array.isArray(r.entries)) return null
  const entries: MatchEntry[] = []
  for (const value of r.entries) {
    const parsed = matchEntrySchema.safeParse(value)
    if (parsed.success) entries.push(parsed.data)
  }
  if (entries.length === 0 && r.entries.length > 0) return null
  const inflight = Array.isArray(r.inflight) && r.inflight.every(id => typeof id === 'string') ? r.inflight as string[] : null
  const conflict = isMark(r.conflict) ? { version: r.conflict.version, length: r.conflict.length, at: String((r.conflict as { at?: unknown }).at ?? '') } : null
  const refusedRaw = r.refused as { message?: unknown, at?: unknown } | null | undefined
  const refused = refusedRaw && typeof refusedRaw.message === 'string' ? { message: refusedRaw.message, at: String(refusedRaw.at ?? '') } : null
  return {
    clubId: r.clubId,
    eventId: r.eventId,
    ring: r.ring,
    tournamentId: r.tournamentId,
    matchId: r.matchId,
    label: typeof r.label === 'string' ? r.label : `Match ${r.matchId}`,
    base: { version: r.base.version, length: r.base.length },
    entries,
    inflight: inflight && inflight.some(id => entries.some(e => e.id === id)) ? inflight : null,
    conflict,
    refused,
  }
}
