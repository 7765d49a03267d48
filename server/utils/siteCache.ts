import { gzip } from 'node:zlib'
import { promisify } from 'node:util'
import type { H3Event } from 'h3'

// The club site's pages, rendered once and kept in this process's memory as bytes. A page is
// re-checked at most every FRESH_MS: one query reads a stamp of everything the club site shows
// (results, events, fighters, breakdowns, clips) and the page is rendered again only when the
// stamp moved, or when it is MAX_AGE_MS old in any case. While a page renders again, readers get
// the copy they had (stale while revalidating). Nitro's own route-rule cache re-parses the whole
// stored page on every hit and renders on every expiry: on a large event page that cost more than
// the rendering we meant to save (see DEVELOPERS.md, "Freshness").

export const FRESH_MS = 5_000
export const MAX_AGE_MS = 30_000
const MAX_PAGES = 500
const RENDER_HEADER = 'x-unscathed-site-render'

// Club pages only: the live page, the feeds and the sitemap are always made afresh.
const CACHED_PATH = /^\/site\/([a-z0-9-]{1,64})(?:\/(?:events\/[a-z0-9-]{1,64}|posts\/[a-z0-9-]{1,80}|matches\/\d{1,10}|fighters\/\d{1,10}))?\/?$/

interface Page {
  body: Buffer
  gzipped: Buffer
  type: string
  etag: string
  stamp: string
  renderedAt: number
  checkedAt: number
}

const pages = new Map<string, Page>()
const pending = new Map<string, Promise<Page | null>>()
const gzipAsync = promisify(gzip)

// Everything a club's public pages are drawn from, summed up; a change anywhere moves it.
const STAMP = {
  name: 'site_cache_stamp',
  text: `
with c as (select id, updated_at from clubs where slug = $1),
ev as (select e.id, e.updated_at from events e join c on e.club_id = c.id),
t as (select t.id, t.updated_at from tournaments t join ev on t.event_id = ev.id),
m as (select m.* from matches m join t on m.tournament_id = t.id)
select concat_ws('|',
  (select updated_at from c),
  (select count(*) || ':' || max(updated_at) from ev),
  (select count(*) || ':' || max(updated_at) from t),
  (select count(*) || ':' || max(en.updated_at) from entries en join t on en.tournament_id = t.id),
  (select count(*) || ':' || max(f.updated_at) from fighters f join c on f.club_id = c.id),
  (select md5(coalesce(string_agg(concat_ws(',', m.id, m.status, m.side_a_entry, m.side_b_entry, m.forfeited_by, m.version), ';' order by m.id), '')) from m),
  (select count(*) || ':' || coalesce(sum(pm.entry_id * pm.position), 0) from pool_members pm join pools p on p.id = pm.pool_id join t on p.tournament_id = t.id),
  (select count(*) || ':' || max(b.updated_at) from brackets b join t on b.tournament_id = t.id),
  (select count(*) from tournament_lots l join t on l.tournament_id = t.id),
  (select count(*) || ':' || max(p.updated_at) || ':' || count(*) filter (where p.status = 'published' and p.published_at <= now()) from posts p join c on p.club_id = c.id),
  (select count(*) || ':' || max(k.updated_at) from clips k join c on k.club_id = c.id)
) as stamp`,
}

const stamps = new Map<string, { at: number, value: Promise<string> }>()

/** The club's stamp, read at most once per FRESH_MS however many of its pages are checked. */
function clubStamp(slug: string): Promise<string> {
  const now = Date.now()
  const known = stamps.get(slug)
  if (known && now - known.at < FRESH_MS) return known.value
  const value = rawQuery<{ stamp: string | null }>(useDb(), { ...STAMP, values: [slug] }).then(rows => rows[0]?.stamp ?? '')
  if (stamps.size >= MAX_PAGES) stamps.delete(stamps.keys().next().value!)
  stamps.set(slug, { at: now, value })
  value.catch(() => stamps.delete(slug))
  return value
}

async function render(path: string, slug: string): Promise<Page | null> {
  const stamp = await clubStamp(slug)
  // Rendered as an anonymous reader: no cookies go with it.
  const res = await useNitroApp().localFetch(path, { headers: { [RENDER_HEADER]: '1', accept: 'text/html' } })
  if (res.status !== 200) {
    // Gone or failing now (a breakdown sent back to draft): the old copy must not outlive it.
    pages.delete(path)
    return null
  }
  const body = Buffer.from(await res.arrayBuffer())
  const now = Date.now()
  const page: Page = {
    body,
    gzipped: await gzipAsync(body),
    type: res.headers.get('content-type') ?? 'text/html;charset=utf-8',
    etag: `W/"${stamp.length}-${now.toString(36)}"`,
    stamp,
    renderedAt: now,
    checkedAt: now,
  }
  if (pages.size >= MAX_PAGES && !pages.has(path)) pages.delete(pages.keys().next().value!)
  pages.set(path, page)
  return page
}

function once(path: string, work: () => Promise<Page | null>): Promise<Page | null> {
  let running = pending.get(path)
  if (!running) {
    running = work().finally(() => pending.delete(path))
    pending.set(path, running)
  }
  return running
}

/** Checks a page whose time is up: renders it again only if the club's data moved (or it is old). */
async function revalidate(path: string, slug: string, page: Page): Promise<Page | null> {
  const stamp = await clubStamp(slug)
  if (stamp === page.stamp && Date.now() - page.renderedAt < MAX_AGE_MS) {
    page.checkedAt = Date.now()
    return page
  }
  return render(path, slug)
}

function send(event: H3Event, page: Page, state: string) {
  const gzipOk = /\bgzip\b/.test(getRequestHeader(event, 'accept-encoding') ?? '')
  setResponseHeaders(event, {
    'content-type': page.type,
    'etag': page.etag,
    'vary': 'accept-encoding',
    'cache-control': 'public, max-age=0, must-revalidate',
    'x-site-cache': state,
  })
  if (getRequestHeader(event, 'if-none-match') === page.etag) {
    setResponseStatus(event, 304)
    return ''
  }
  if (gzipOk) setResponseHeader(event, 'content-encoding', 'gzip')
  const body = gzipOk ? page.gzipped : page.body
  setResponseHeader(event, 'content-length', body.length)
  return event.method === 'HEAD' ? '' : body
}

/**
 * Answers a club-site page from memory, or returns undefined to let it render as usual: other
 * paths, signed-in readers (they see their own header), the render itself, and error pages.
 */
export async function siteCacheAnswer(event: H3Event) {
  if (event.method !== 'GET' && event.method !== 'HEAD') return undefined
  if (getRequestHeader(event, RENDER_HEADER)) return undefined
  const path = event.path.split('?')[0]!
  const match = CACHED_PATH.exec(path)
  if (!match || path !== event.path) return undefined
  if (getCookie(event, useRuntimeConfig().session?.name ?? 'nuxt-session')) return undefined
  const slug = match[1]!
  const page = pages.get(path)
  if (page) {
    if (Date.now() - page.checkedAt >= FRESH_MS) {
      void once(path, () => revalidate(path, slug, page)).catch(err => console.error('[site cache]', err))
      return send(event, page, 'stale')
    }
    return send(event, page, 'hit')
  }
  try {
    const fresh = await once(path, () => render(path, slug))
    return fresh ? send(event, fresh, 'miss') : undefined
  }
  catch (err) {
    console.error('[site cache]', err)
    return undefined
  }
}
