/** What closing a tournament needs to know of a final match. */
export interface FinalMatchState {
  status: 'scheduled' | 'under-way' | 'finished' | 'forfeit'
  winner: 'a' | 'b' | 'draw' | null
}

/**
 * Final matches still to fence or to settle: in a bracket a match that ended level waits for the
 * director's decision (recorded as a forfeit); in a round robin a draw simply counts.
 */
export function openFinalMatches(format: 'bracket' | 'round-robin' | null, matches: readonly FinalMatchState[]): FinalMatchState[] {
  return matches.filter(m => m.status !== 'forfeit' && !(m.status === 'finished' && (m.winner === 'a' || m.winner === 'b' || format === 'round-robin')))
}
