// The pool draw's randomness: the same generator as the drawn lot (shared/utils/random.ts).
import { hashString, randomFromKey, seededShuffle } from '../utils/random'

export const hashKey = hashString
export const randomFrom = randomFromKey

/** A copy of the items in an order fixed by the key. */
export function shuffleWithKey<T>(items: readonly T[], key: string): T[] {
  return seededShuffle(items, randomFromKey(key))
}
