import { z } from 'zod'
import { MARK_COMMENT_MAX, MARK_KIND_NAME_MAX, MARK_KINDS_MAX, MARK_LABEL_MAX } from '../footage/marks'

const ONE_LINE = /^[^\r\n\u2028\u2029]*$/

const idSchema = z.number({ error: 'Use the id as a number' }).int({ error: 'Use a whole number' }).positive({ error: 'Must be positive' }).max(2147483647)

export const markKindNameSchema = z.string({ error: 'Enter a name' }).trim()
  .min(1, { error: 'Enter a name' })
  .max(MARK_KIND_NAME_MAX, { error: `Use at most ${MARK_KIND_NAME_MAX} characters` })
  .regex(ONE_LINE, { error: 'Use one line' })

export const markKindCreateSchema = z.object({ name: markKindNameSchema }).strict()
export const markKindPatchSchema = z.object({ name: markKindNameSchema }).strict()

/** Every kind of the club once, in the new order. */
export const markKindOrderSchema = z.object({
  ids: z.array(idSchema, { error: 'Send the kinds’ ids in the new order' })
    .min(1, { error: 'Send the kinds’ ids in the new order' })
    .max(MARK_KINDS_MAX)
    .refine(ids => new Set(ids).size === ids.length, { error: 'Name each kind once' }),
}).strict()

const atMsSchema = z.number({ error: 'Give the time in milliseconds' })
  .int({ error: 'Give the time in whole milliseconds' })
  .min(0, { error: 'The time cannot be before the clip starts' })
  .max(24 * 3_600_000, { error: 'The time is after the clip ends' })

const markFields = {
  atMs: atMsSchema,
  kindId: idSchema.nullable(),
  label: z.string({ error: 'Enter a label' }).trim()
    .min(1, { error: 'Enter a label' })
    .max(MARK_LABEL_MAX, { error: `Use at most ${MARK_LABEL_MAX} characters` })
    .regex(ONE_LINE, { error: 'Use one line' }),
  comment: z.string({ error: 'Write the comment as text' }).trim()
    .max(MARK_COMMENT_MAX, { error: `Use at most ${MARK_COMMENT_MAX} characters` })
    .regex(ONE_LINE, { error: 'Keep the comment to one line' }),
}

export const markCreateSchema = z.object({
  ...markFields,
  kindId: markFields.kindId.default(null),
  comment: markFields.comment.default(''),
  // Kept when a deleted mark is put back (undo), so a mark suggested from the desk stays linked.
  entryId: z.uuid({ error: 'Use the desk entry’s id' }).nullable().default(null),
}).strict()

export const markPatchSchema = z.object(markFields).partial().strict()
  .refine(patch => Object.keys(patch).length > 0, { error: 'Send at least one of atMs, kindId, label, comment' })

export type MarkCreateInput = z.infer<typeof markCreateSchema>
export type MarkPatchInput = z.infer<typeof markPatchSchema>
