import { describe, expect, it } from 'vitest'
import { drawLot, hashString, mulberry32 } from '../../../shared/rules'

describe('the lot', () => {
  it('hashes with 32-bit FNV-1a (test vectors of draft-eastlake-fnv, read in copies of public test suites)', () => {
    expect(hashString('')).toBe(0x811C9DC5)
    expect(hashString('a')).toBe(0xE40C292C)
    expect(hashString('foobar')).toBe(0xBF9CF968)
  })

  it('generates the same numbers in [0, 1) from the same seed', () => {
    const one = mulberry32(42)
    const two = mulberry32(42)
    const a = Array.from({ length: 1000 }, () => one())
    expect(Array.from({ length: 1000 }, () => two())).toEqual(a)
    expect(a.every(x => x >= 0 && x < 1)).toBe(true)
    expect(Array.from({ length: 5 }, mulberry32(43))).not.toEqual(a.slice(0, 5))
    // 10 000 draws of a uniform number average 0.5 within a few standard errors (0.0029 each).
    const next = mulberry32(7)
    const mean = Array.from({ length: 10_000 }, () => next()).reduce((s, x) => s + x, 0) / 10_000
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.015)
  })

  it('draws an order of the tied fighters that does not depend on how they are listed', () => {
    const draw = drawLot('harvest-open', ['wren', 'ada', 'mara'])
    expect(draw.fighterIds).toEqual(['ada', 'mara', 'wren'])
    expect([...draw.order].sort()).toEqual(draw.fighterIds)
    expect(drawLot('harvest-open', ['mara', 'wren', 'ada', 'ada'])).toEqual(draw)
  })

  it('gives every order a fair chance over many seeds', () => {
    // 600 seeds over the 6 orders of 3 fighters: about 100 each (standard deviation about 9).
    const counts = new Map<string, number>()
    for (let i = 0; i < 600; i++) {
      const key = drawLot(`pool-${i}`, ['ada', 'mara', 'wren']).order.join(' ')
      counts.set(key, (counts.get(key) ?? 0) + 1)
    }
    expect(counts.size).toBe(6)
    for (const n of counts.values()) expect(n).toBeGreaterThan(60)
    for (const n of counts.values()) expect(n).toBeLessThan(140)
  })
})
