import { and, desc, eq, sql } from 'drizzle-orm'
import { z } from 'zod'
import { idParamSchema } from '#shared/schemas/club'
import type { Role } from '#shared/utils/roles'
import type { DbTx } from './events'

// Breakdown posts: who may do what, the version check, and the revisions every save writes.

type Post = typeof schema.posts.$inferSelect

export const postParams = z.object({ clubId: idParamSchema, postId: idParamSchema })
export const revisionParams = postParams.extend({ revision: idParamSchema })

export const POST_ROLES: readonly Role[] = ['commentator', 'editor', 'admin']
export const PUBLISHER_ROLES: readonly Role[] = ['editor', 'admin']

export const isPublisher = (roles: readonly Role[]) => hasAnyRole(roles, PUBLISHER_ROLES)

/** Editors and admins edit any post; a commentator only their own draft. */
export function canEdit(roles: readonly Role[], userId: number, post: Pick<Post, 'authorId' | 'status'>): boolean {
  return isPublisher(roles) || (post.authorId === userId && post.status === 'draft')
}

export function requireEdit(roles: readonly Role[], userId: number, post: Pick<Post, 'authorId' | 'status'>) {
  if (canEdit(roles, userId, post)) return
  throw createError({
    statusCode: 403,
    statusMessage: 'Forbidden',
    message: post.authorId === userId
      ? 'This breakdown is with the editors now: an editor can send it back to draft'
      : 'Only its writer (while it is a draft), an editor or an admin can change this breakdown',
  })
}

export async function findPost(db: DbTx, clubId: number, postId: number, options: { lock?: boolean } = {}) {
  const p = schema.posts
  const query = db.select().from(p).where(and(eq(p.id, postId), eq(p.clubId, clubId)))
  const [post] = options.lock ? await query.for('update') : await query
  if (!post) throw notFoundError('Breakdown')
  return post
}

/** Where the post stands for readers: a draft, in review, scheduled or live. */
export function postStage(post: Pick<Post, 'status' | 'publishedAt'>, now = new Date()) {
  if (post.status !== 'published') return post.status
  return post.publishedAt && post.publishedAt.getTime() <= now.getTime() ? 'live' : 'scheduled'
}

export async function postView(db: DbTx, post: Post) {
  const [author] = post.authorId === null
    ? []
    : await db.select({ name: schema.users.name }).from(schema.users).where(eq(schema.users.id, post.authorId))
  return {
    id: post.id,
    slug: post.slug,
    title: post.title,
    summary: post.summary,
    body: post.body,
    eventId: post.eventId,
    status: post.status,
    stage: postStage(post),
    publishAt: post.publishAt,
    publishedAt: post.publishedAt,
    authorId: post.authorId,
    authorName: author?.name ?? null,
    version: post.version,
    createdAt: post.createdAt,
    updatedAt: post.updatedAt,
  }
}

export type PostView = Awaited<ReturnType<typeof postView>>

/** 409 when the post moved on since the caller read it; the answer carries the post as it is now. */
export async function requireVersion(db: DbTx, post: Post, expectedVersion: number) {
  if (post.version === expectedVersion) return
  throw createError({
    statusCode: 409,
    statusMessage: 'Conflict',
    message: `expectedVersion: Someone saved this breakdown meanwhile (version ${post.version}); your changes were not saved`,
    data: { fields: { expectedVersion: 'Someone saved this breakdown meanwhile' }, current: await postView(db, post) },
  })
}

export async function writeRevision(tx: DbTx, post: Pick<Post, 'id' | 'title' | 'summary' | 'body'>, authorId: number) {
  const r = schema.postRevisions
  await tx.insert(r).values({
    postId: post.id,
    number: sql`(select coalesce(max(${r.number}), 0) + 1 from ${r} where ${r.postId} = ${post.id})`,
    title: post.title,
    summary: post.summary,
    body: post.body,
    authorId,
  })
}

export async function requireClubEvent(db: DbTx, clubId: number, eventId: number | null | undefined) {
  if (eventId === null || eventId === undefined) return
  const [found] = await db.select({ id: schema.events.id }).from(schema.events).where(and(eq(schema.events.id, eventId), eq(schema.events.clubId, clubId)))
  if (!found) throw fieldError(400, 'eventId', 'No such event in this club')
}

/** A slug from the title, unique in the club (`-2`, `-3` … when taken). */
export async function freeSlug(db: DbTx, clubId: number, title: string) {
  const base = title.normalize('NFKD').replace(/[\u0300-\u036F]/g, '').toLowerCase()
    .replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60).replace(/-+$/, '') || 'breakdown'
  const p = schema.posts
  const taken = new Set((await db.select({ slug: p.slug }).from(p)
    .where(and(eq(p.clubId, clubId), sql`${p.slug} like ${`${base}%`}`))).map(x => x.slug))
  if (!taken.has(base)) return base
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`
}

/** Live posts of a club, newest first: published with their time passed (a scheduled post is not shown before). */
export function livePostsWhere(clubId: number) {
  const p = schema.posts
  return and(eq(p.clubId, clubId), eq(p.status, 'published'), sql`${p.publishedAt} <= now()`)
}

export async function livePosts(db: DbTx, clubId: number, limit: number) {
  const p = schema.posts
  return db.select({
    id: p.id, slug: p.slug, title: p.title, summary: p.summary, body: p.body, publishedAt: p.publishedAt, updatedAt: p.updatedAt,
    eventId: p.eventId, authorName: schema.users.name,
  }).from(p).leftJoin(schema.users, eq(schema.users.id, p.authorId))
    .where(livePostsWhere(clubId)).orderBy(desc(p.publishedAt), desc(p.id)).limit(limit)
}

export type LivePost = Awaited<ReturnType<typeof livePosts>>[number]

export async function findLivePost(db: DbTx, clubId: number, slug: string) {
  const p = schema.posts
  const [post] = await db.select({
    id: p.id, slug: p.slug, title: p.title, summary: p.summary, body: p.body, publishedAt: p.publishedAt, updatedAt: p.updatedAt,
    eventId: p.eventId, authorName: schema.users.name,
  }).from(p).leftJoin(schema.users, eq(schema.users.id, p.authorId)).where(and(livePostsWhere(clubId), eq(p.slug, slug)))
  if (!post) throw notFoundError('Breakdown')
  return post
}

export function postPath(clubSlug: string, postSlug: string) {
  return `/site/${clubSlug}/posts/${postSlug}`
}
