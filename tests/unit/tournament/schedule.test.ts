import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { planSchedule, ringQueues } from '../../../shared/tournament'
import type { Schedule, ScheduleInput, ScheduleMatch, ScheduledMatch } from '../../../shared/tournament'

const MIN = 60_000
const START = Date.UTC(2031, 8, 20, 8, 0) // 08:00, the invented Wrenmouth Harvest Open
const at = (minutes: number) => START + minutes * MIN

const match = (id: string, poolId: number, a: number, b: number, minutes = 5): ScheduleMatch => ({ id, poolId, fighterIds: [a, b], minutes })
const startsOf = (schedule: Schedule, ringId: number) => schedule.rings.find(r => r.ringId === ringId)!.matches.map(m => (m.start - START) / MIN)
const all = (schedule: Schedule) => schedule.rings.flatMap(r => r.matches)

describe('planSchedule', () => {
  it('runs one ring\'s matches one after another with the changeover between them', () => {
    const schedule = planSchedule({
      rings: [1],
      pools: [{ id: 10, ringId: 1 }],
      matches: [match('a', 10, 1, 2), match('b', 10, 3, 4), match('c', 10, 1, 3, 4)],
      start: START,
      changeoverMinutes: 2,
    })
    expect(startsOf(schedule, 1)).toEqual([0, 7, 14])
    expect(schedule.end).toBe(at(18))
    expect(schedule.conflicts).toEqual([])
  })

  it('runs the rings side by side', () => {
    const schedule = planSchedule({
      rings: [1, 2],
      pools: [{ id: 10, ringId: 1 }, { id: 20, ringId: 2 }],
      matches: [match('a', 10, 1, 2), match('b', 20, 3, 4), match('c', 10, 5, 6), match('d', 20, 7, 8)],
      start: START,
      changeoverMinutes: 1,
    })
    expect(startsOf(schedule, 1)).toEqual([0, 6])
    expect(startsOf(schedule, 2)).toEqual([0, 6])
  })

  it('makes a ring wait for a fighter busy in another ring, and reports it', () => {
    // Fighter 7 is in the sword and buckler pool in ring 1 and the longsword pool in ring 2.
    const schedule = planSchedule({
      rings: [1, 2],
      pools: [{ id: 10, ringId: 1 }, { id: 20, ringId: 2 }],
      matches: [match('sb-1', 10, 7, 2, 6), match('ls-1', 20, 7, 9, 4)],
      start: START,
      changeoverMinutes: 1,
      ringChangeMinutes: 2,
    })
    expect(startsOf(schedule, 2)).toEqual([8])
    expect(schedule.conflicts).toEqual([{
      kind: 'fighter-waits',
      matchId: 'ls-1',
      ringId: 2,
      otherMatchId: 'sb-1',
      otherRingId: 1,
      fighterId: 7,
      minutes: 8,
      message: 'Match ls-1 in ring 2 waits 8 min for fighter 7, who fences match sb-1 in ring 1',
    }])
  })

  it('places finals by their own ring', () => {
    const schedule = planSchedule({
      rings: [3],
      pools: [],
      matches: [{ id: 'r2m1', ringId: 3, fighterIds: [101, 104], minutes: 8 }],
      start: START,
      changeoverMinutes: 0,
    })
    expect(schedule.rings[0]!.matches[0]).toMatchObject({ id: 'r2m1', ringId: 3, poolId: null, start: START, end: at(8) })
  })

  it('refuses a match with no ring, a ring not in the schedule, a repeated id, a bad length or one fighter twice', () => {
    const base: ScheduleInput = { rings: [1], pools: [{ id: 10, ringId: 1 }], matches: [], start: START, changeoverMinutes: 1 }
    expect(() => planSchedule({ ...base, matches: [{ id: 'x', fighterIds: [1, 2], minutes: 5 }] })).toThrow(/Match x has no ring/)
    expect(() => planSchedule({ ...base, matches: [match('x', 99, 1, 2)] })).toThrow(/pool 99, which has no ring/)
    expect(() => planSchedule({ ...base, pools: [{ id: 10, ringId: 4 }] })).toThrow(/ring 4, which is not in the schedule/)
    expect(() => planSchedule({ ...base, matches: [match('x', 10, 1, 2), match('x', 10, 3, 4)] })).toThrow(/listed twice/)
    expect(() => planSchedule({ ...base, matches: [match('x', 10, 1, 2, 0)] })).toThrow(/positive number of minutes/)
    expect(() => planSchedule({ ...base, matches: [match('x', 10, 3, 3)] })).toThrow(/fighter 3 on both sides/)
    expect(() => planSchedule({ ...base, changeoverMinutes: -1 })).toThrow(/non-negative/)
  })
})

describe('planSchedule with progress, and ringQueues', () => {
  const input: ScheduleInput = {
    rings: [1, 2],
    pools: [{ id: 10, ringId: 1 }, { id: 20, ringId: 2 }],
    matches: [
      match('p1-1', 10, 1, 2), match('p1-2', 10, 3, 4), match('p1-3', 10, 1, 3), match('p1-4', 10, 2, 4),
      match('p2-1', 20, 5, 6), match('p2-2', 20, 7, 8),
    ],
    start: START,
    changeoverMinutes: 1,
  }

  it('drops finished matches, keeps the one under way and plans the rest from now', () => {
    const schedule = planSchedule(input, { now: at(9), finished: ['p1-1'], underway: [{ id: 'p1-2', startedAt: at(7) }] })
    const ring1 = schedule.rings[0]!
    expect(ring1.finished).toEqual(['p1-1'])
    expect(ring1.matches.map(m => [m.id, m.status, (m.start - START) / MIN])).toEqual([
      ['p1-2', 'underway', 7],
      ['p1-3', 'pending', 13],
      ['p1-4', 'pending', 19],
    ])
    // Nothing has started in ring 2, so it starts now.
    expect(startsOf(schedule, 2)).toEqual([9, 15])
  })

  it('lets a match that runs over its estimate push the ring back', () => {
    const schedule = planSchedule(input, { now: at(20), finished: ['p1-1'], underway: [{ id: 'p1-2', startedAt: at(7) }] })
    expect(schedule.rings[0]!.matches[0]!.end).toBe(at(20))
    expect(startsOf(schedule, 1)).toEqual([7, 21, 27])
  })

  it('shows now, on deck and next for every ring', () => {
    const schedule = planSchedule(input, { now: at(9), finished: ['p1-1'], underway: [{ id: 'p1-2', startedAt: at(7) }] })
    const [ring1, ring2] = ringQueues(schedule)
    expect([ring1!.now?.id, ring1!.onDeck?.id, ring1!.next?.id, ring1!.later]).toEqual(['p1-2', 'p1-3', 'p1-4', 0])
    expect([ring2!.now, ring2!.onDeck?.id, ring2!.next?.id, ring2!.later]).toEqual([null, 'p2-1', 'p2-2', 0])
  })

  it('shows an empty queue for a ring that is done', () => {
    const schedule = planSchedule(input, { now: at(30), finished: ['p2-1', 'p2-2'], underway: [] })
    expect(ringQueues(schedule)[1]).toEqual({ ringId: 2, now: null, onDeck: null, next: null, later: 0 })
    expect(schedule.rings[1]!.end).toBeNull()
  })

  it('reports a recorded state with a fighter or a ring in two matches at once', () => {
    const crossed: ScheduleInput = { ...input, matches: [...input.matches, match('p2-3', 20, 1, 5)] }
    const schedule = planSchedule(crossed, {
      now: at(2),
      finished: [],
      underway: [{ id: 'p1-1', startedAt: at(0) }, { id: 'p2-3', startedAt: at(1) }, { id: 'p2-1', startedAt: at(1) }],
    })
    expect(schedule.conflicts.map(c => [c.kind, c.fighterId])).toEqual([
      ['fighter-overlap', 1],
      ['ring-overlap', null],
      ['fighter-overlap', 5],
    ])
  })

  it('refuses progress that names unknown matches or a match both finished and under way', () => {
    expect(() => planSchedule(input, { now: START, finished: ['zz'], underway: [] })).toThrow(/Finished match zz/)
    expect(() => planSchedule(input, { now: START, finished: [], underway: [{ id: 'zz', startedAt: START }] })).toThrow(/Match zz, under way/)
    expect(() => planSchedule(input, { now: START, finished: ['p1-1'], underway: [{ id: 'p1-1', startedAt: START }] })).toThrow(/both finished and under way/)
  })
})

/** A day of random pools over 1-4 rings, fighters drawn from a small field so that they collide. */
const dayArb = fc.record({
  ringCount: fc.integer({ min: 1, max: 4 }),
  changeover: fc.integer({ min: 0, max: 3 }),
  ringChange: fc.integer({ min: 0, max: 3 }),
  matches: fc.array(fc.record({
    pool: fc.integer({ min: 0, max: 5 }),
    a: fc.integer({ min: 1, max: 12 }),
    b: fc.integer({ min: 1, max: 12 }),
    minutes: fc.integer({ min: 1, max: 10 }),
  }), { maxLength: 40 }),
}).map(({ ringCount, changeover, ringChange, matches }): ScheduleInput => ({
  rings: Array.from({ length: ringCount }, (_, i) => i + 1),
  pools: Array.from({ length: 6 }, (_, i) => ({ id: i, ringId: (i % ringCount) + 1 })),
  matches: matches
    .filter(m => m.a !== m.b)
    .map((m, i) => ({ id: i, poolId: m.pool, fighterIds: [m.a, m.b] as const, minutes: m.minutes })),
  start: START,
  changeoverMinutes: changeover,
  ringChangeMinutes: ringChange,
}))

const overlap = (x: ScheduledMatch, y: ScheduledMatch) => x.start < y.end && y.start < x.end

describe('planSchedule properties', () => {
  it('never runs two matches at once in a ring, and keeps the changeover between them', () => {
    fc.assert(fc.property(dayArb, (input) => {
      for (const ring of planSchedule(input).rings) {
        const sorted = [...ring.matches].sort((x, y) => x.start - y.start)
        for (let i = 1; i < sorted.length; i++) {
          expect(sorted[i]!.start).toBeGreaterThanOrEqual(sorted[i - 1]!.end + input.changeoverMinutes * MIN)
        }
      }
    }))
  })

  it('never has a fighter in two places at once', () => {
    fc.assert(fc.property(dayArb, (input) => {
      const matches = all(planSchedule(input))
      for (const x of matches) {
        for (const y of matches) {
          if (x.id !== y.id && x.fighterIds.some(f => y.fighterIds.includes(f))) expect(overlap(x, y)).toBe(false)
        }
      }
    }))
  })

  it('schedules every match once, each ring in the order given', () => {
    fc.assert(fc.property(dayArb, (input) => {
      const schedule = planSchedule(input)
      expect(all(schedule).map(m => m.id).sort((x, y) => Number(x) - Number(y))).toEqual(input.matches.map(m => m.id))
      for (const ring of schedule.rings) {
        const ids = ring.matches.map(m => m.id)
        const given = input.matches.filter(m => (m.poolId! % input.rings.length) + 1 === ring.ringId).map(m => m.id)
        expect(ids).toEqual(given)
      }
    }))
  })

  it('reports every wait: a match starts late only with a conflict saying why', () => {
    fc.assert(fc.property(dayArb, (input) => {
      const schedule = planSchedule(input)
      const waits = new Map(schedule.conflicts.filter(c => c.kind === 'fighter-waits').map(c => [c.matchId, c.minutes]))
      for (const ring of schedule.rings) {
        ring.matches.forEach((m, i) => {
          const ready = i === 0 ? START : ring.matches[i - 1]!.end + input.changeoverMinutes * MIN
          expect((m.start - ready) / MIN).toBeCloseTo(waits.get(m.id) ?? 0, 9)
        })
      }
    }))
  })

  it('plans nothing before now when re-planned part way through', () => {
    fc.assert(fc.property(dayArb, fc.integer({ min: 0, max: 60 }), (input, minutes) => {
      const finished = input.matches.filter((_, i) => i % 3 === 0).map(m => m.id)
      const schedule = planSchedule(input, { now: at(minutes), finished, underway: [] })
      for (const m of all(schedule)) expect(m.start).toBeGreaterThanOrEqual(at(minutes))
      expect(all(schedule)).toHaveLength(input.matches.length - finished.length)
    }))
  })
})
