import type { Action, MatchEntry, PoolMatch, RuleSet, RuleSetInput, Side, Target, PresetId } from '../../../shared/rules'
import { presetCopy, ruleSetSchema } from '../../../shared/rules'

type Draft<T> = T extends { id: string } ? Omit<T, 'id'> & { id?: string } : never
export type EntryDraft = Draft<MatchEntry>
type HitDraft = [Target, Action]

/** A log with ids e1, e2, … unless an entry brings its own. */
export function log(...drafts: EntryDraft[]): MatchEntry[] {
  return drafts.map((draft, i) => ({ ...draft, id: draft.id ?? `e${i + 1}` }) as MatchEntry)
}

export const clean = (side: Side, target: Target = 'torso', action: Action = 'cut'): EntryDraft =>
  ({ kind: 'clean', side, target, action })

export const afterblow = (side: Side, first: HitDraft, answer: HitDraft): EntryDraft =>
  ({ kind: 'afterblow', side, target: first[0], action: first[1], afterblow: { target: answer[0], action: answer[1] } })

export const double = (a: HitDraft = ['torso', 'cut'], b: HitDraft = ['torso', 'cut']): EntryDraft =>
  ({ kind: 'double', a: { target: a[0], action: a[1] }, b: { target: b[0], action: b[1] } })

export const voided = (reason: 'not-seen' | 'no-valid-hit' = 'not-seen'): EntryDraft => ({ kind: 'void', reason })
export const card = (side: Side, colour: 'warning' | 'yellow' | 'red' | 'black'): EntryDraft => ({ kind: 'card', side, colour })
export const ringOut = (side: Side): EntryDraft => ({ kind: 'ring-out', side })
export const timeUp = (): EntryDraft => ({ kind: 'time-up' })
export const concede = (side: Side): EntryDraft => ({ kind: 'concede', side })
export const cancel = (targetId: string, id?: string): EntryDraft => ({ kind: 'cancel', targetId, ...(id === undefined ? {} : { id }) })

/** A preset with some settings changed, checked by the schema. */
export function rules(preset: PresetId, patch: Partial<RuleSetInput> = {}): RuleSet {
  return ruleSetSchema.parse({ ...presetCopy(preset), ...patch })
}

export function finished(id: string, a: string, b: string, entries: MatchEntry[]): PoolMatch {
  return { id, a, b, status: 'finished', entries }
}

export function unfought(id: string, a: string, b: string, entries: MatchEntry[] = []): PoolMatch {
  return { id, a, b, status: 'unfought', entries }
}

/** Every pair of the list once, in list order. */
export function pairs<T>(items: readonly T[]): [T, T][] {
  const out: [T, T][] = []
  for (let i = 0; i < items.length; i++) {
    for (let j = i + 1; j < items.length; j++) out.push([items[i]!, items[j]!])
  }
  return out
}

/** Invented fighters, by club. */
export const FIGHTERS = {
  saltmarsh: ['Ada Brackwater', 'Tobin Reedley'],
  ironquay: ['Mara Holloway', 'Cato Flint'],
  northDowns: ['Wren Ashby', 'Oswin Hale'],
  lanterngate: ['Isolde Carrow', 'Piers Lumley'],
} as const
