import type { Pair } from './types'

export interface BergerRound {
  /** 1-based. */
  round: number
  /** Boards in table order; the first listed has white (takes the first side). */
  pairs: Pair[]
  /** The player who sits this round out, for an odd number of players. */
  bye: number | null
}

/**
 * Round robin rounds by the Berger tables (FIDE Handbook C.05, Annex 1): round 1 pairs 1 with n,
 * 2 with n − 1 and so on; from one round to the next every player but n moves on by n/2 places
 * (counting round 1 to n − 1), and n changes colour each round. With an odd count the missing
 * highest number is the bye.
 */
export function bergerRounds(players: number): BergerRound[] {
  if (!Number.isInteger(players) || players < 2) {
    throw new Error(`A round robin needs at least 2 players, not ${players}`)
  }
  const n = players % 2 === 0 ? players : players + 1
  const step = n / 2
  const move = (p: number, round: number) => ((p - 1 + (round - 1) * step) % (n - 1)) + 1
  const rounds: BergerRound[] = []
  for (let round = 1; round < n; round++) {
    const boards: Pair[] = []
    const opponentOfLast = move(1, round)
    boards.push(round % 2 === 1 ? [opponentOfLast, n] : [n, opponentOfLast])
    for (let board = 2; board <= step; board++) {
      boards.push([move(board, round), move(n + 1 - board, round)])
    }
    const bye = n === players ? null : opponentOfLast
    rounds.push({
      round,
      pairs: bye === null ? boards : boards.filter(([a, b]) => a !== n && b !== n),
      bye,
    })
  }
  return rounds
}

/** The Berger rounds one after another, as a single bout order. */
export function bergerOrder(players: number): Pair[] {
  return bergerRounds(players).flatMap(round => round.pairs)
}
