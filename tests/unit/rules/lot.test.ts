import { describe, expect, it } from 'vitest'
import { drawLot } from '../../../shared/rules'

describe('the lot', () => {
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
