// A small server-sent events client over node:http for the tests and the live benchmark: it
// keeps every message with the time it arrived, sends Last-Event-ID when asked, and can stop
// reading to play a slow client. Node 20 has no EventSource of its own.
import http from 'node:http'

export interface SseMessage {
  id: string | null
  event: string
  data: string
  /** performance.now() when the message was complete. */
  at: number
}

export interface SseOptions {
  lastEventId?: string
  headers?: Record<string, string>
  onMessage?: (message: SseMessage) => void
}

export class SseClient {
  readonly messages: SseMessage[] = []
  comments = 0
  status = 0
  closed = false
  private request: http.ClientRequest | null = null
  private response: http.IncomingMessage | null = null
  private buffer = ''
  private waiters: (() => void)[] = []

  constructor(readonly url: string, private readonly options: SseOptions = {}) {}

  /** Connects and resolves once the response headers are in. */
  open(): Promise<this> {
    return new Promise((resolve, reject) => {
      const headers: Record<string, string> = { accept: 'text/event-stream', ...this.options.headers }
      if (this.options.lastEventId) headers['last-event-id'] = this.options.lastEventId
      this.request = http.get(this.url, { headers, agent: false }, (res) => {
        this.response = res
        this.status = res.statusCode ?? 0
        res.setEncoding('utf8')
        res.on('data', (chunk: string) => this.feed(chunk))
        res.on('close', () => {
          this.closed = true
          this.wake()
        })
        resolve(this)
      })
      this.request.on('error', (err) => {
        this.closed = true
        this.wake()
        if (!this.response) reject(err)
      })
    })
  }

  private feed(chunk: string) {
    this.buffer += chunk
    let end: number
    while ((end = this.buffer.indexOf('\n\n')) >= 0) {
      const block = this.buffer.slice(0, end)
      this.buffer = this.buffer.slice(end + 2)
      const message: SseMessage = { id: null, event: 'message', data: '', at: performance.now() }
      let hasData = false
      for (const line of block.split('\n')) {
        if (line.startsWith(':')) {
          this.comments++
          continue
        }
        const colon = line.indexOf(':')
        const field = colon < 0 ? line : line.slice(0, colon)
        const value = colon < 0 ? '' : line.slice(colon + 1).replace(/^ /, '')
        if (field === 'id') message.id = value
        else if (field === 'event') message.event = value
        else if (field === 'data') {
          message.data += (hasData ? '\n' : '') + value
          hasData = true
        }
      }
      if (!hasData) continue
      this.messages.push(message)
      this.options.onMessage?.(message)
    }
    this.wake()
  }

  private wake() {
    const waiters = this.waiters
    this.waiters = []
    for (const w of waiters) w()
  }

  /** Waits until `test` holds over the messages so far, or fails after `timeoutMs`. */
  async until(test: (messages: SseMessage[]) => boolean, timeoutMs = 5000, what = 'the expected messages'): Promise<SseMessage[]> {
    const deadline = Date.now() + timeoutMs
    while (!test(this.messages)) {
      if (this.closed) throw new Error(`the stream closed before ${what} (${this.messages.length} messages)`)
      const left = deadline - Date.now()
      if (left <= 0) throw new Error(`no ${what} within ${timeoutMs} ms (${this.messages.length} messages)`)
      await new Promise<void>((resolve) => {
        const timer = setTimeout(resolve, left)
        this.waiters.push(() => {
          clearTimeout(timer)
          resolve()
        })
      })
    }
    return this.messages
  }

  /** Resolves when the server closes the stream. */
  async untilClosed(timeoutMs = 5000) {
    const deadline = Date.now() + timeoutMs
    while (!this.closed) {
      if (Date.now() > deadline) throw new Error(`the stream stayed open for ${timeoutMs} ms`)
      await new Promise(resolve => setTimeout(resolve, 20))
    }
  }

  /** Stops reading: the server's writes pile up, as with a client on a bad link. */
  pause() {
    this.response?.pause()
  }

  resume() {
    this.response?.resume()
  }

  close() {
    this.request?.destroy()
    this.closed = true
  }

  /** The parsed data of every message of a kind. */
  json<T = unknown>(event?: string): T[] {
    return this.messages.filter(m => !event || m.event === event).map(m => JSON.parse(m.data) as T)
  }

  get lastId(): string | null {
    return this.messages.at(-1)?.id ?? null
  }
}

export async function openStream(url: string, options: SseOptions = {}) {
  return new SseClient(url, options).open()
}
