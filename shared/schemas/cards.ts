import { z } from 'zod'
import { CAPTION_MAX, CARD_KINDS, CARD_SIZE_NAMES, HEADLINE_MAX, SUBJECT_OF_KIND } from '../cards/types'

const id = (what: string) => z.number({ error: `Choose ${what}` }).int({ error: `Choose ${what}` }).positive({ error: `Choose ${what}` }).max(2147483647)

const line = (max: number) => z.string({ error: 'Must be text' }).transform(s => s.replace(/\s+/g, ' ').trim())
  .pipe(z.string().max(max, { error: `Use at most ${max} characters` }))

export const cardSizeSchema = z.enum(CARD_SIZE_NAMES, { error: `Choose a size: ${CARD_SIZE_NAMES.join(', ')}` })

/** One card for the studio: what it shows, its size, and the editor's headline and caption. */
export const cardRequestSchema = z.object({
  tournamentId: id('a tournament'),
  kind: z.enum(CARD_KINDS, { error: `Choose a kind of card: ${CARD_KINDS.join(', ')}` }),
  // The match, fighter's entry or pool; not needed for the tournament's own cards.
  subjectId: id('what the card is about').nullable().optional(),
  size: cardSizeSchema,
  // Blank means the card's own headline.
  headline: line(HEADLINE_MAX).optional(),
  caption: line(CAPTION_MAX).optional(),
}).strict().superRefine((value, ctx) => {
  if (SUBJECT_OF_KIND[value.kind] !== 'tournament' && (value.subjectId === undefined || value.subjectId === null)) {
    ctx.addIssue({ code: 'custom', path: ['subjectId'], message: `Choose the ${SUBJECT_OF_KIND[value.kind]} the card is about` })
  }
})

export const cardBatchSchema = z.object({
  tournamentId: id('a tournament'),
  sizes: z.array(cardSizeSchema, { error: 'Choose at least one size' }).min(1, { error: 'Choose at least one size' }).max(CARD_SIZE_NAMES.length)
    .refine(sizes => new Set(sizes).size === sizes.length, { error: 'Name each size once' }),
}).strict()

export type CardRequest = z.infer<typeof cardRequestSchema>
export type CardBatchRequest = z.infer<typeof cardBatchSchema>
