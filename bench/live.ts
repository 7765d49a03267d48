// The live bus end to end: overlay clients (200, and 1000 as a stretch) connected to one ring's
// overlay stream in this process, apart from the server; bout entries posted one after another
// through the ring desk's real route (session, PostgreSQL commit, NOTIFY, fan-out); the latency
// from the moment each entry is sent to each client's receipt of it. Then the overlay page's
// JavaScript as the server transfers it (gzip). Run: npm run bench:live [-- clients]
import http from 'node:http'
import { performance } from 'node:perf_hooks'
import { withBenchEnvironment } from './environment'
import { OverlayClient } from './liveClients'

const CLIENTS = Number(process.argv[2] ?? process.env.LIVE_CLIENTS ?? 200)
const STRETCH_CLIENTS = 1000
const ENTRIES = 200
const WARM_UP = 20

interface Run { clients: number, samples: number[], missing: number }

function quantile(sorted: readonly number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!
}

const fmt = (n: number) => n.toFixed(2)

await withBenchEnvironment({ name: 'pg-bench', pgPort: 54349, appPort: 3300 }, async ({ appUrl, databaseUrl }) => {
  // The test helpers read these when they load.
  process.env.NUXT_DATABASE_URL = databaseUrl
  process.env.TEST_APP_URL = appUrl
  const { makeClub, pool } = await import('../tests/support/fixtures')
  const { ROSTER, as, clean, drawPools, makeFixture } = await import('../tests/support/tournament')

  // An invented ring: 36 fighters in three pools of twelve, all fenced in ring 1.
  const club = await makeClub('bench-live')
  const organizer = await as(club, 'organizer')
  const fighters = Array.from({ length: 36 }, (_, i) => ({ name: `${ROSTER[i % 12]!.name} ${Math.floor(i / 12) + 1}`, clubName: ROSTER[i % 12]!.clubName }))
  const f = await makeFixture(club, organizer, { rings: 1, poolSize: 12, fighters })
  const matches = (await drawPools(f)).flatMap(p => p.matches)
  const table = await as(club, 'scorekeeper')
  const cookie = [...table.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  const rings = await organizer.get(`/api/clubs/${club.id}/events/${f.eventId}/rings`)
  const overlayPath: string = rings.data.rings[0].overlay.path
  const token = overlayPath.split('/').pop()!

  // Bouts in fencing order: three clean hits a match, the second to side b.
  const bouts = matches.flatMap(m => [1, 2, 3].map(version => ({ matchId: m.id, version })))
  let next = 0
  // The desk's requests on one kept-alive connection, as a browser tab would send them.
  const deskAgent = new http.Agent({ keepAlive: true, maxSockets: 1 })
  const acks: number[] = []
  function send(path: string, body: string): Promise<{ status: number, text: string }> {
    return new Promise((resolve, reject) => {
      const req = http.request(`${appUrl}${path}`, { method: 'POST', agent: deskAgent, headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(body), cookie } }, (res) => {
        const parts: Buffer[] = []
        res.on('data', (part: Buffer) => parts.push(part))
        res.on('end', () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(parts).toString('utf8') }))
      })
      req.on('error', reject)
      req.end(body)
    })
  }
  async function post(): Promise<{ key: string, sent: number }> {
    const bout = bouts[next++]
    if (!bout) throw new Error('the ring has no bouts left to fence')
    const body = JSON.stringify({ expectedVersion: bout.version - 1, entries: [clean(bout.version === 2 ? 'b' : 'a')] })
    const sent = performance.now()
    const res = await send(`${f.base}/matches/${bout.matchId}/entries`, body)
    acks.push(performance.now() - sent)
    if (res.status !== 201) throw new Error(`the desk route answered ${res.status}: ${res.text}`)
    return { key: `${bout.matchId}:${bout.version}`, sent }
  }

  async function measure(count: number): Promise<Run> {
    const clients = Array.from({ length: count }, () => new OverlayClient(`${appUrl}/live/overlay/${token}`))
    for (let i = 0; i < count; i += 100) await Promise.all(clients.slice(i, i + 100).map(c => c.open()))
    for (let i = 0; i < WARM_UP; i++) await post()
    const sent = new Map<string, number>()
    acks.length = 0
    for (let i = 0; i < ENTRIES; i++) {
      const { key, sent: at } = await post()
      sent.set(key, at)
      // One bout after another, as a desk sends them: the next goes once this one is acknowledged.
    }
    await new Promise(resolve => setTimeout(resolve, 1000))
    const samples: number[] = []
    let missing = 0
    for (const client of clients) {
      const got = new Map(client.receipts.map(r => [`${r.matchId}:${r.version}`, r.at]))
      for (const [key, at] of sent) {
        const receipt = got.get(key)
        if (receipt === undefined) missing++
        else samples.push(receipt - at)
      }
      client.close()
    }
    samples.sort((a, b) => a - b)
    const sortedAcks = [...acks].sort((a, b) => a - b)
    console.log(`desk acknowledgement (ms), ${count} clients: p50=${fmt(quantile(sortedAcks, 0.5))} p99=${fmt(quantile(sortedAcks, 0.99))}`)
    return { clients: count, samples, missing }
  }

  const report = (run: Run) => `clients=${run.clients} entries=${ENTRIES} samples=${run.samples.length} missing=${run.missing} `
    + `p50=${fmt(quantile(run.samples, 0.5))} p90=${fmt(quantile(run.samples, 0.9))} p99=${fmt(quantile(run.samples, 0.99))} max=${fmt(run.samples.at(-1)!)}`

  const main = await measure(CLIENTS)
  console.log(`live latency, send → receipt (ms): ${report(main)}   goal p99 ≤ 16.7`)
  const stretch = await measure(STRETCH_CLIENTS)
  console.log(`live latency, send → receipt (ms): ${report(stretch)}   stretch goal p99 ≤ 33`)

  // The overlay page's scripts, fetched as a browser source would, counted as transferred.
  const html = await (await fetch(`${appUrl}${overlayPath}`)).text()
  const scripts = new Set([...html.matchAll(/<(?:script[^>]+src|link[^>]+rel="modulepreload"[^>]+href)="([^"]+\.js)"/g)].map(m => m[1]!))
  let gzipBytes = 0
  let rawBytes = 0
  for (const src of scripts) {
    const res = await fetch(new URL(src, appUrl), { headers: { 'accept-encoding': 'gzip' } })
    const body = await res.arrayBuffer()
    rawBytes += body.byteLength
    gzipBytes += Number(res.headers.get('content-length') ?? 0) || (await gzipLength(new Uint8Array(body)))
    if (res.headers.get('content-encoding') !== 'gzip') console.log(`  note: ${src} was not served with gzip`)
  }
  console.log(`overlay page JavaScript: ${scripts.size} files, ${(gzipBytes / 1024).toFixed(1)} KB gzip as transferred (${(rawBytes / 1024).toFixed(1)} KB unpacked)   goal ≤ 100 KB`)
  await pool.end()
  console.log(`live_latency_ms p50=${fmt(quantile(main.samples, 0.5))} p99=${fmt(quantile(main.samples, 0.99))} clients=${main.clients}`)
})

async function gzipLength(bytes: Uint8Array): Promise<number> {
  const { gzipSync } = await import('node:zlib')
  return gzipSync(bytes, { level: 9 }).byteLength
}
