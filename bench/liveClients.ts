// The clients of the live benchmark: many overlay streams on plain sockets. While the benchmark
// runs, a client only notes when each chunk of bytes arrives; the HTTP and SSE framing is taken
// apart afterwards. Each real overlay is its own browser and parses its own copy; one process
// parsing hundreds of copies in the middle of the run would mostly measure itself.
import net from 'node:net'
import { performance } from 'node:perf_hooks'

export interface Receipt { matchId: number, version: number, at: number }

export class OverlayClient {
  private readonly chunks: { at: number, data: Buffer }[] = []
  private socket: net.Socket | null = null

  constructor(private readonly url: string) {}

  /** Connects and resolves once the stream has sent its first message (the ring's snapshot). */
  open(): Promise<void> {
    const { hostname, port, pathname, search } = new URL(this.url)
    return new Promise((resolve, reject) => {
      let ready = false
      const socket = net.connect({ host: hostname, port: Number(port) }, () => {
        socket.setNoDelay(true)
        socket.write(`GET ${pathname}${search} HTTP/1.1\r\nHost: ${hostname}:${port}\r\nAccept: text/event-stream\r\n\r\n`)
      })
      this.socket = socket
      socket.on('data', (data: Buffer) => {
        this.chunks.push({ at: performance.now(), data })
        if (!ready && data.includes('event: ring')) {
          ready = true
          resolve()
        }
      })
      socket.on('error', (err) => {
        if (!ready) reject(err)
      })
    })
  }

  /** Every `match` message with the time its last byte arrived. */
  get receipts(): Receipt[] {
    const raw = Buffer.concat(this.chunks.map(c => c.data))
    // Where each received chunk ends in `raw`, to date a byte.
    const ends: number[] = []
    let total = 0
    for (const c of this.chunks) ends.push(total += c.data.length)
    const arrival = (offset: number) => {
      let lo = 0
      let hi = ends.length - 1
      while (lo < hi) {
        const mid = (lo + hi) >> 1
        if (ends[mid]! > offset) hi = mid
        else lo = mid + 1
      }
      return this.chunks[lo]!.at
    }
    // The body after the headers, remembering where each body byte sat in `raw` (pairs of body
    // offset and raw offset); a chunked body is taken apart, a plain one is the rest of the bytes.
    const head = raw.indexOf('\r\n\r\n')
    const chunked = /transfer-encoding:\s*chunked/i.test(raw.subarray(0, head).toString('latin1'))
    let at = head + 4
    const body: Buffer[] = []
    const origin: number[] = []
    let length = 0
    while (chunked && at < raw.length) {
      const line = raw.indexOf('\r\n', at)
      if (line < 0) break
      const size = Number.parseInt(raw.subarray(at, line).toString('latin1'), 16)
      if (!Number.isFinite(size) || size === 0) break
      const start = line + 2
      body.push(raw.subarray(start, start + size))
      origin.push(length, start)
      length += size
      at = start + size + 2
    }
    if (!chunked) {
      body.push(raw.subarray(at))
      origin.push(0, at)
    }
    const text = Buffer.concat(body)
    // Offsets are asked for in increasing order, so one pointer walks the pieces once.
    let piece = 0
    const rawOffset = (bodyOffset: number) => {
      while (piece + 2 < origin.length && origin[piece + 2]! <= bodyOffset) piece += 2
      return origin[piece + 1]! + (bodyOffset - origin[piece]!)
    }
    const receipts: Receipt[] = []
    let from = 0
    for (;;) {
      const end = text.indexOf('\n\n', from)
      if (end < 0) break
      const block = text.subarray(from, end).toString('utf8')
      from = end + 2
      if (!block.includes('event: match')) continue
      const data = block.slice(block.indexOf('data: ') + 6)
      const message = JSON.parse(data) as { match: { id: number, version: number } }
      receipts.push({ matchId: message.match.id, version: message.match.version, at: arrival(rawOffset(end + 1)) })
    }
    return receipts
  }

  close() {
    this.socket?.destroy()
  }
}
