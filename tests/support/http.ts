// A small HTTP client for the integration tests: real requests to the built server, with a
// cookie jar per simulated person.
// Not BASE_URL: vitest sets that one to Vite's base path.
export const BASE_URL = process.env.TEST_APP_URL ?? 'http://127.0.0.1:3100'
export const INBOX_URL = process.env.FAKE_INBOX_URL ?? 'http://127.0.0.1:2590'

export class Client {
  cookies = new Map<string, string>()
  setCookieHeaders: string[] = []

  async request(method: string, path: string, options: { json?: unknown, body?: BodyInit, headers?: Record<string, string> } = {}) {
    const headers: Record<string, string> = { accept: 'application/json', ...options.headers }
    if (this.cookies.size) headers.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    let body = options.body
    if (options.json !== undefined) {
      headers['content-type'] ??= 'application/json'
      body = JSON.stringify(options.json)
    }
    const res = await fetch(new URL(path, BASE_URL), { method, headers, body, redirect: 'manual' })
    this.setCookieHeaders = res.headers.getSetCookie()
    for (const line of this.setCookieHeaders) {
      const [pair] = line.split(';')
      const [name, ...rest] = pair!.split('=')
      const value = rest.join('=')
      if (!value || /max-age=0/i.test(line) || /expires=thu, 01 jan 1970/i.test(line)) this.cookies.delete(name!.trim())
      else this.cookies.set(name!.trim(), value)
    }
    const text = await res.text()
    return { status: res.status, data: parseJson(text), headers: res.headers, text }
  }

  get(path: string) { return this.request('GET', path) }
  post(path: string, json?: unknown) { return this.request('POST', path, { json: json ?? {} }) }
  patch(path: string, json: unknown) { return this.request('PATCH', path, { json }) }
  delete(path: string) { return this.request('DELETE', path) }

  async signIn(email: string, password: string) {
    const res = await this.post('/api/auth/sign-in', { email, password })
    if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}: ${res.text}`)
    return this
  }
}

// Answers are checked field by field by the tests' assertions, so they stay loosely typed here.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Json = any

function parseJson(text: string): Json {
  try {
    return text ? JSON.parse(text) : null
  }
  catch {
    return text
  }
}

export interface InboxMessage { id: string, from: string, to: string[], subject: string, date: string, text: string, html: string }

export async function inboxFor(address: string): Promise<InboxMessage[]> {
  const res = await fetch(new URL('/messages', INBOX_URL))
  const { messages } = await res.json() as { messages: InboxMessage[] }
  return messages.filter(m => m.to.some(to => to.toLowerCase().includes(address.toLowerCase())))
}

/** Waits for the newest message to an address (SMTP delivery is asynchronous to the API answer). */
export async function waitForMail(address: string, count = 1, timeoutMs = 5000): Promise<InboxMessage> {
  const until = Date.now() + timeoutMs
  for (;;) {
    const messages = await inboxFor(address)
    if (messages.length >= count) return messages[0]!
    if (Date.now() > until) throw new Error(`no mail #${count} for ${address} within ${timeoutMs} ms`)
    await new Promise(r => setTimeout(r, 100))
  }
}

export function linkIn(message: InboxMessage, pathStart: string): string {
  const match = new RegExp(`https?://[^\\s]+${pathStart}[A-Za-z0-9_-]+`).exec(message.text)
  if (!match) throw new Error(`no ${pathStart} link in: ${message.text}`)
  return match[0]
}
