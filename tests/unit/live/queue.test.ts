import { describe, expect, it } from 'vitest'
import {
  acknowledge,
  canWithdraw,
  discardAll,
  emptyQueue,
  enqueue,
  isSettled,
  markSent,
  nextBatch,
  parseQueue,
  queueKey,
  refuse,
  resolveConflict,
  retryDelay,
  ringKeyPrefix,
  staleVersion,
  withdraw,
} from '../../../shared/live/queue'
import type { MatchQueue } from '../../../shared/live/queue'
import type { MatchEntry } from '../../../shared/rules'

const target = { clubId: 3, eventId: 7, ring: 2, tournamentId: 11, matchId: 40, label: 'Maren Holt v Corin Vale' }
const hit = (id: string, side: 'a' | 'b' = 'a'): MatchEntry => ({ kind: 'clean', id, side, target: 'torso', action: 'cut' })
const ids = (q: MatchQueue) => q.entries.map(e => e.id)

/** A queue with entries recorded on a match whose log held `length` entries at `version`. */
function queued(version: number, length: number, ...entryIds: string[]): MatchQueue {
  return entryIds.reduce((q, id) => enqueue(q, hit(id), { version, length }), emptyQueue(target, { version, length }))
}

describe('the desk\'s outbox', () => {
  it('keys each match of each ring of each event and club apart', () => {
    expect(queueKey(target)).toBe('unscathed.desk.3.7.2.40')
    expect(queueKey(target).startsWith(ringKeyPrefix(target))).toBe(true)
    expect(queueKey({ ...target, ring: 1 }).startsWith(ringKeyPrefix(target))).toBe(false)
    expect(new Set([queueKey(target), queueKey({ ...target, clubId: 4 }), queueKey({ ...target, eventId: 8 }), queueKey({ ...target, matchId: 41 })]).size).toBe(4)
  })

  it('records the first entry on the match as the desk saw it, and keeps that base while entries wait', () => {
    let q = enqueue(emptyQueue(target, { version: 0, length: 0 }), hit('e1'), { version: 5, length: 4 })
    expect(q.base).toEqual({ version: 5, length: 4 })
    q = enqueue(q, hit('e2'), { version: 6, length: 5 })
    expect(q.base).toEqual({ version: 5, length: 4 })
    expect(nextBatch(q)).toEqual({ ids: ['e1', 'e2'], entries: [hit('e1'), hit('e2')], expectedVersion: 5 })
  })

  it('sends a batch whose answer was lost again alone, before entries recorded since', () => {
    let q = markSent(queued(5, 4, 'e1', 'e2'), ['e1', 'e2'])
    q = enqueue(q, hit('e3'), { version: 9, length: 9 })
    expect(nextBatch(q)).toMatchObject({ ids: ['e1', 'e2'], expectedVersion: 5 })
    expect(nextBatch(q, 1)?.ids).toEqual(['e1', 'e2'])
  })

  it('sends at most the batch size, in the order recorded', () => {
    expect(nextBatch(queued(0, 0, 'e1', 'e2', 'e3'), 2)?.ids).toEqual(['e1', 'e2'])
  })

  it('drops acknowledged entries and moves the base to the server\'s version', () => {
    let q = markSent(queued(5, 4, 'e1', 'e2'), ['e1', 'e2'])
    q = enqueue(q, hit('e3'), { version: 5, length: 4 })
    q = acknowledge(q, { version: 6, ids: ['s1', 's2', 's3', 's4', 'e1', 'e2'] })
    expect(ids(q)).toEqual(['e3'])
    expect(q.inflight).toBeNull()
    expect(q.conflict).toBeNull()
    expect(nextBatch(q)).toMatchObject({ ids: ['e3'], expectedVersion: 6 })
    q = acknowledge(markSent(q, ['e3']), { version: 7, ids: ['s1', 's2', 's3', 's4', 'e1', 'e2', 'e3'] })
    expect(isSettled(q)).toBe(true)
    expect(q.base).toEqual({ version: 7, length: 7 })
  })

  it('takes a resend the server already held (answered as duplicates) as done, with no conflict', () => {
    let q = markSent(queued(5, 4, 'e1'), ['e1'])
    q = enqueue(q, hit('e2'), { version: 5, length: 4 })
    // The first answer was lost; the resend of e1 comes back as a duplicate at version 6.
    q = acknowledge(q, { version: 6, ids: ['s1', 's2', 's3', 's4', 'e1'] })
    expect(q.conflict).toBeNull()
    expect(nextBatch(q)).toMatchObject({ ids: ['e2'], expectedVersion: 6 })
  })

  it('holds the waiting entries when a duplicate answer shows another desk wrote after them', () => {
    let q = markSent(queued(5, 4, 'e1'), ['e1'])
    q = enqueue(q, hit('e2'), { version: 5, length: 4 })
    q = acknowledge(q, { version: 7, ids: ['s1', 's2', 's3', 's4', 'e1', 'other'] }, '2026-10-10T10:00:00.000Z')
    expect(ids(q)).toEqual(['e2'])
    expect(q.conflict).toEqual({ version: 7, length: 6, at: '2026-10-10T10:00:00.000Z' })
    expect(nextBatch(q)).toBeNull()
  })

  it('turns a stale version with another desk\'s entries into a conflict the table settles', () => {
    const stale = staleVersion(markSent(queued(2, 2, 'e1', 'e2'), ['e1', 'e2']), { version: 3, ids: ['s1', 's2', 'other'] })
    expect(stale.conflict).toMatchObject({ version: 3, length: 3 })
    expect(stale.inflight).toBeNull()
    expect(ids(stale)).toEqual(['e1', 'e2'])
    expect(nextBatch(stale)).toBeNull()

    const sent = resolveConflict(stale, 'send')
    expect(sent.conflict).toBeNull()
    expect(nextBatch(sent)).toMatchObject({ ids: ['e1', 'e2'], expectedVersion: 3 })
    expect(sent.base).toEqual({ version: 3, length: 3 })

    const dropped = resolveConflict(stale, 'discard')
    expect(isSettled(dropped)).toBe(true)
    expect(dropped.base).toEqual({ version: 3, length: 3 })
  })

  it('moves on by itself when the version changed without new entries (the clock)', () => {
    const q = staleVersion(queued(4, 3, 'e1'), { version: 6, ids: ['s1', 's2', 's3'] })
    expect(q.conflict).toBeNull()
    expect(nextBatch(q)).toMatchObject({ ids: ['e1'], expectedVersion: 6 })
  })

  it('finds its own stored batch in a stale answer and sends only the rest', () => {
    // e1 was stored but its answer lost; the next request (e1 again with e2 would be one batch) finds the log moved.
    const q = staleVersion(queued(4, 3, 'e1', 'e2'), { version: 5, ids: ['s1', 's2', 's3', 'e1'] })
    expect(q.conflict).toBeNull()
    expect(nextBatch(q)).toMatchObject({ ids: ['e2'], expectedVersion: 5 })
  })

  it('takes back an entry before it is sent, but not one on its way', () => {
    let q = markSent(queued(0, 0, 'e1'), ['e1'])
    q = enqueue(q, hit('e2'), { version: 0, length: 0 })
    expect(canWithdraw(q, 'e2')).toBe(true)
    expect(canWithdraw(q, 'e1')).toBe(false)
    expect(withdraw(q, 'e1')).toBe(q)
    expect(ids(withdraw(q, 'e2'))).toEqual(['e1'])
    expect(canWithdraw(null, 'e1')).toBe(false)
  })

  it('keeps refused entries until the table discards them', () => {
    const q = refuse(markSent(queued(1, 1, 'e1'), ['e1']), 'The match has ended; no more entries can be added to it')
    expect(q.refused?.message).toContain('ended')
    expect(nextBatch(q)).toBeNull()
    expect(isSettled(q)).toBe(false)
    expect(isSettled(discardAll(q))).toBe(true)
  })

  it('waits longer after each failed attempt, up to half a minute', () => {
    expect([0, 1, 2, 3, 4, 5, 6, 20].map(retryDelay)).toEqual([1000, 2000, 4000, 8000, 16_000, 30_000, 30_000, 30_000])
  })

  it('reads a queue back from storage and refuses what is not one', () => {
    const q = markSent(queued(5, 4, 'e1', 'e2'), ['e1'])
    expect(parseQueue(JSON.stringify(q))).toEqual(q)
    expect(parseQueue(null)).toBeNull()
    expect(parseQueue('{not json')).toBeNull()
    expect(parseQueue(JSON.stringify({ ...q, matchId: 'forty' }))).toBeNull()
    expect(parseQueue(JSON.stringify({ ...q, entries: [{ kind: 'teleport', id: 'x' }] }))).toBeNull()
    // An entry the schema refuses is left out; the others stay.
    const mixed = parseQueue(JSON.stringify({ ...q, entries: [...q.entries, { kind: 'clean', id: 'e3', side: 'c' }] }))
    expect(mixed?.entries.map(e => e.id)).toEqual(['e1', 'e2'])
    // A batch mark naming no waiting entry is dropped.
    expect(parseQueue(JSON.stringify({ ...q, inflight: ['gone'] }))?.inflight).toBeNull()
  })
})
