import { z } from 'zod'

export const POST_STATUSES = ['draft', 'review', 'published'] as const
export type PostStatus = typeof POST_STATUSES[number]

export const POST_STATUS_LABELS: Record<PostStatus, string> = {
  draft: 'Draft',
  review: 'In review',
  published: 'Published',
}

export const POST_TITLE_MAX = 160
export const POST_SUMMARY_MAX = 400
export const POST_BODY_MAX = 60_000

const title = z.string().trim().min(3, { error: 'Give the breakdown a title of at least 3 characters' }).max(POST_TITLE_MAX)
const summary = z.string().trim().max(POST_SUMMARY_MAX, { error: `Keep the summary under ${POST_SUMMARY_MAX} characters` })
const body = z.string().max(POST_BODY_MAX, { error: `Keep the text under ${POST_BODY_MAX} characters` })
const version = z.number({ error: 'Send the version you edited' }).int().positive()
const eventId = z.number({ error: 'Must be an event id' }).int().positive().nullable()

export const postCreateSchema = z.object({
  title,
  summary: summary.default(''),
  body: body.default(''),
  eventId: eventId.default(null),
}).strict()

export const postPatchSchema = z.object({
  expectedVersion: version,
  title: title.optional(),
  summary: summary.optional(),
  body: body.optional(),
  eventId: eventId.optional(),
}).strict()

/**
 * A move in the workflow: `review` (submit), `published` (now, or at `publishAt`), `draft`
 * (back to the writer).
 */
export const postStatusSchema = z.object({
  expectedVersion: version,
  to: z.enum(POST_STATUSES, { error: 'Choose draft, review or published' }),
  publishAt: z.iso.datetime({ offset: true, error: 'Use a date and time like 2026-10-01T18:00:00Z' }).nullable().default(null),
}).strict()

export const postRestoreSchema = z.object({ expectedVersion: version }).strict()

export const postPreviewSchema = z.object({ body }).strict()

export const postListQuerySchema = z.object({
  status: z.enum(POST_STATUSES, { error: 'Choose draft, review or published' }).optional(),
})

export type PostCreateInput = z.infer<typeof postCreateSchema>
export type PostPatchInput = z.infer<typeof postPatchSchema>

export const postSlugSchema = z.string().regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, { error: 'Not a breakdown address' }).max(80)
