// The club site under load: a published event with 8 pools of 8 fighters, every pool match fenced
// through the ring desk's route, and a breakdown with a pool table and a match; then autocannon
// against the event page and the breakdown page for 10 s each, as anonymous readers. The pages are
// served through the club site's short SWR cache (nuxt.config.ts routeRules), as in production.
// Run: npm run bench:pages. Last line: page_rps=<slower page's requests/s> p99_ms=<its p99>.
import autocannon from 'autocannon'
import { withBenchEnvironment } from './environment'

const SECONDS = 10
const CONNECTIONS = 10
const POOLS = 8
const POOL_SIZE = 8

interface Figure { path: string, rps: number, p99: number, non2xx: number, errors: number, bytes: number, gzipBytes: number }

async function hammer(url: string, path: string): Promise<Figure> {
  // One request first: the page is rendered once and cached, as after the first reader.
  const first = await fetch(url + path)
  if (first.status !== 200) throw new Error(`${path} answered ${first.status}`)
  const bytes = Buffer.byteLength(await first.text())
  const gzipped = await fetch(url + path, { headers: { 'accept-encoding': 'gzip' } })
  const gzipBytes = Number(gzipped.headers.get('content-length') ?? 0)
  await gzipped.arrayBuffer()
  // As a browser asks for a page: HTML, compressed.
  const result = await autocannon({ url: url + path, connections: CONNECTIONS, duration: SECONDS, headers: { 'accept': 'text/html', 'accept-encoding': 'gzip, deflate, br' } })
  return { path, rps: result.requests.average, p99: result.latency.p99, non2xx: result.non2xx, errors: result.errors, bytes, gzipBytes }
}

await withBenchEnvironment({ name: 'pg-bench-pages', pgPort: 54311, appPort: 3360 }, async ({ appUrl, databaseUrl }) => {
  process.env.NUXT_DATABASE_URL = databaseUrl
  process.env.TEST_APP_URL = appUrl
  const { makeClub } = await import('../tests/support/fixtures')
  const { ROSTER, as, drawPools, fenceMatch, makeFixture } = await import('../tests/support/tournament')

  // Invented fighters: the demo roster's names numbered, 64 in all.
  const club = await makeClub('bench-pages')
  const organizer = await as(club, 'organizer')
  const fighters = Array.from({ length: POOLS * POOL_SIZE }, (_, i) => ({ name: `${ROSTER[i % 12]!.name} ${Math.floor(i / 12) + 1}`, clubName: ROSTER[i % 12]!.clubName }))
  const f = await makeFixture(club, organizer, { rings: 4, poolSize: POOL_SIZE, fighters })
  const pools = await drawPools(f)
  if (pools.length !== POOLS || pools.some(p => p.fighters.length !== POOL_SIZE)) throw new Error(`expected ${POOLS} pools of ${POOL_SIZE}`)
  let fenced = 0
  for (const pool of pools) {
    for (const [i, match] of pool.matches.entries()) {
      await fenceMatch(f, match, match.sideA!.name, 1 + (i % 3))
      fenced++
    }
  }
  const published = await organizer.post(`/api/clubs/${club.id}/events/${f.eventId}/publish`)
  if (published.status !== 200) throw new Error(`publishing answered ${published.status}`)

  const commentator = await as(club, 'commentator')
  const editor = await as(club, 'editor')
  const firstMatch = pools[0]!.matches[0]!
  const body = [
    '## How pool one was won', '',
    'A long morning in ring one: patient guards, few doubles, and a final bout decided on the last exchange.', '',
    `[[pool ${f.tournamentId} 1]]`, '',
    '### The opening match', '',
    'Watch the buckler hand: it closes the line before the cut lands.', '',
    `[[match ${firstMatch.id}]]`, '',
    `[[card match ${firstMatch.id}]]`,
  ].join('\n')
  const post = await commentator.post(`/api/clubs/${club.id}/posts`, { title: 'Pool one, bout by bout', summary: 'The pool that decided the seeds', body, eventId: f.eventId })
  if (post.status !== 201) throw new Error(`the breakdown answered ${post.status}: ${post.text}`)
  const out = await editor.post(`/api/clubs/${club.id}/posts/${post.data.id}/status`, { expectedVersion: post.data.version, to: 'published' })
  if (out.status !== 200) throw new Error(`publishing the breakdown answered ${out.status}: ${out.text}`)
  console.log(`set up: ${POOLS} pools of ${POOL_SIZE}, ${fenced} matches fenced, one breakdown`)

  const figures: Figure[] = []
  for (const path of [`/site/${club.slug}/events/${f.eventSlug}`, `/site/${club.slug}/posts/${post.data.slug}`]) {
    const figure = await hammer(appUrl, path)
    if (figure.non2xx > 0 || figure.errors > 0) throw new Error(`${path}: ${figure.non2xx} answers not 2xx, ${figure.errors} errors`)
    figures.push(figure)
    console.log(`${path}: ${figure.rps.toFixed(1)} requests/s, p99 ${figure.p99} ms (${CONNECTIONS} connections, ${SECONDS} s; page ${Math.round(figure.bytes / 1024)} KiB, ${Math.round(figure.gzipBytes / 1024)} KiB gzip)`)
  }
  const slower = figures.reduce((a, b) => (b.rps < a.rps ? b : a))
  console.log(`page_rps=${slower.rps.toFixed(1)} p99_ms=${slower.p99}`)
})
