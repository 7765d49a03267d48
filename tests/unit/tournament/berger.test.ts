import { describe, expect, it } from 'vitest'
import { bergerOrder, bergerRounds } from '../../../shared/tournament'
import { coversEveryPairOnce } from './support'

const text = (players: number) => bergerRounds(players).map(r => r.pairs.map(([a, b]) => `${a}-${b}`).join(' '))

// Source: FIDE Handbook C.05, Annex 1, Berger tables (READ via a copy); check values as quoted in
// DOMAIN.md. Side order matters: the first listed has white.
describe('Berger round robin tables', () => {
  it('gives the published rounds for 4 players (FIDE Handbook C.05 Annex 1)', () => {
    expect(text(4)).toEqual(['1-4 2-3', '4-3 1-2', '2-4 3-1'])
  })

  it('gives the published rounds for 6 players (FIDE Handbook C.05 Annex 1)', () => {
    expect(text(6)).toEqual([
      '1-6 2-5 3-4',
      '6-4 5-3 1-2',
      '2-6 3-1 4-5',
      '6-5 1-4 2-3',
      '3-6 4-2 5-1',
    ])
  })

  it('makes the highest number the bye for an odd count: 5 players use the table of 6 (FIDE Handbook C.05 Annex 1)', () => {
    const five = bergerRounds(5)
    const six = bergerRounds(6)
    expect(five).toHaveLength(5)
    five.forEach((round, i) => {
      const full = six[i]!.pairs
      const withSix = full.find(pair => pair.includes(6))!
      expect(round.bye).toBe(withSix[0] === 6 ? withSix[1] : withSix[0])
      expect(round.pairs).toEqual(full.filter(pair => !pair.includes(6)))
    })
  })

  it('meets every pair once, each player at most once a round, for 2 to 30 players', () => {
    for (let n = 2; n <= 30; n++) {
      const rounds = bergerRounds(n)
      expect(rounds).toHaveLength(n % 2 === 0 ? n - 1 : n)
      expect(coversEveryPairOnce(bergerOrder(n), n)).toBe(true)
      for (const round of rounds) {
        const seated = round.pairs.flat()
        expect(new Set(seated).size).toBe(seated.length)
        expect(seated.length + (round.bye === null ? 0 : 1)).toBe(n)
      }
    }
  })

  it('gives each player of an odd count exactly one bye', () => {
    for (const n of [3, 5, 7, 9, 11]) {
      const byes = bergerRounds(n).map(r => r.bye).sort((a, b) => a! - b!)
      expect(byes).toEqual(Array.from({ length: n }, (_, i) => i + 1))
    }
  })

  it('balances colours to within one for every player', () => {
    for (let n = 2; n <= 30; n++) {
      const white = Array.from({ length: n + 1 }, () => 0)
      const black = Array.from({ length: n + 1 }, () => 0)
      for (const [a, b] of bergerOrder(n)) {
        white[a]!++
        black[b]!++
      }
      for (let p = 1; p <= n; p++) expect(Math.abs(white[p]! - black[p]!)).toBeLessThanOrEqual(1)
    }
  })

  it('refuses fewer than two players', () => {
    expect(() => bergerRounds(1)).toThrow(/at least 2/)
    expect(() => bergerRounds(4.5)).toThrow(/at least 2/)
  })
})
