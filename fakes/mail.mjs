// A local mail catcher: SMTP in, JSON out. Messages live in memory only.
import { randomUUID } from 'node:crypto'
import { realpathSync } from 'node:fs'
import http from 'node:http'
import { pathToFileURL } from 'node:url'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import { stopOnSignals } from '../scripts/lib/lifeline.mjs'

const KEEP = 500
const MAX_MESSAGE_BYTES = 25 * 1024 * 1024

export function mailSettings(env = process.env) {
  return {
    smtpPort: Number(env.FAKE_SMTP_PORT || 2525),
    inboxPort: Number(env.FAKE_INBOX_PORT || 2580),
  }
}

function listen(server, port, what) {
  return new Promise((resolve, reject) => {
    const onError = (error) => {
      reject(error.code === 'EADDRINUSE' ? new Error(`${what}: port ${port} is in use`, { cause: error }) : error)
    }
    server.once('error', onError)
    server.listen(port, '127.0.0.1', () => {
      server.off('error', onError)
      resolve()
    })
  })
}

function toMessage(parsed, envelope) {
  return {
    id: randomUUID(),
    from: parsed.from?.text || envelope.mailFrom?.address || '',
    // The envelope, not the To header: it also holds Bcc recipients.
    to: envelope.rcptTo.map(r => r.address),
    subject: parsed.subject ?? '',
    date: new Date().toISOString(),
    text: parsed.text ?? '',
    html: parsed.html || null,
    // Header lines as sent (folded lines joined), the first of each name: lower-case names.
    headers: Object.fromEntries(parsed.headerLines.toReversed().map(h => [h.key, h.line.slice(h.line.indexOf(':') + 1).replace(/\r?\n[ \t]+/g, ' ').trim()])),
    attachments: (parsed.attachments ?? []).map(a => ({
      filename: a.filename ?? null,
      contentType: a.contentType,
      contentId: a.contentId ?? null,
      size: a.size,
      content: a.content.toString('base64'),
    })),
  }
}

function send(res, status, body) {
  const json = JSON.stringify(body)
  res.writeHead(status, { 'content-type': 'application/json; charset=utf-8', 'content-length': Buffer.byteLength(json) })
  res.end(json)
}

export async function startFakeMail(env = process.env) {
  const { smtpPort, inboxPort } = mailSettings(env)
  const messages = []

  const smtp = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS'],
    // Any credentials are accepted, so the app works against the fake with or without NUXT_MAIL_USER.
    authOptional: true,
    allowInsecureAuth: true,
    onAuth: (auth, _session, callback) => callback(null, { user: auth.username || 'anyone' }),
    disableReverseLookup: true,
    size: MAX_MESSAGE_BYTES,
    logger: false,
    banner: 'Unscathed fake SMTP',
    closeTimeout: 1000,
    onData(stream, session, callback) {
      simpleParser(stream).then((parsed) => {
        if (stream.sizeExceeded) {
          const error = new Error('message too large')
          error.responseCode = 552
          return callback(error)
        }
        messages.unshift(toMessage(parsed, session.envelope))
        messages.length = Math.min(messages.length, KEEP)
        callback()
      }, callback)
    },
  })
  smtp.on('error', error => console.error('fake SMTP:', error.message))

  const inbox = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://127.0.0.1')
    const match = /^\/messages(?:\/([^/]+))?\/?$/.exec(url.pathname)
    if (url.pathname === '/' && req.method === 'GET') return send(res, 200, { service: 'unscathed fake inbox', count: messages.length })
    if (!match) return send(res, 404, { error: 'not found' })
    const id = match[1] && decodeURIComponent(match[1])

    if (req.method === 'GET' && !id) {
      const to = url.searchParams.get('to')?.toLowerCase()
      const list = to ? messages.filter(m => m.to.some(address => address.toLowerCase() === to)) : messages
      return send(res, 200, { messages: list })
    }
    if (req.method === 'GET') {
      const message = messages.find(m => m.id === id)
      return message ? send(res, 200, message) : send(res, 404, { error: 'no such message' })
    }
    if (req.method === 'DELETE') {
      const before = messages.length
      if (id) {
        const index = messages.findIndex(m => m.id === id)
        if (index >= 0) messages.splice(index, 1)
      }
      else {
        messages.length = 0
      }
      return send(res, 200, { deleted: before - messages.length })
    }
    res.setHeader('allow', 'GET, DELETE')
    return send(res, 405, { error: 'method not allowed' })
  })

  await listen(smtp, smtpPort, 'fake SMTP')
  try {
    await listen(inbox, inboxPort, 'fake inbox')
  }
  catch (error) {
    smtp.close()
    throw error
  }
  const inboxUrl = `http://127.0.0.1:${inboxPort}`
  console.log(`fake SMTP   127.0.0.1:${smtpPort}  (no TLS, any or no credentials)`)
  console.log(`fake inbox  ${inboxUrl}/messages`)

  return {
    smtpPort,
    inboxUrl,
    close: () => Promise.all([
      new Promise(resolve => smtp.close(resolve)),
      new Promise((resolve) => {
        inbox.close(() => resolve())
        inbox.closeAllConnections()
      }),
    ]),
  }
}

if (process.argv[1] && pathToFileURL(realpathSync(process.argv[1])).href === import.meta.url) {
  try {
    const mail = await startFakeMail()
    stopOnSignals(() => mail.close())
  }
  catch (error) {
    console.error(error.message)
    process.exit(1)
  }
}
