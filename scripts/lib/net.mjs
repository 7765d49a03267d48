import http from 'node:http'
import net from 'node:net'
import { setTimeout as delay } from 'node:timers/promises'
import { Failure } from './ui.mjs'

function canListen(port) {
  return new Promise((resolve) => {
    const server = net.createServer()
    server.once('error', () => resolve(false))
    server.listen({ port, host: '127.0.0.1', exclusive: true }, () => server.close(() => resolve(true)))
  })
}

/** Fails clearly when a port is taken; waits a little first, for processes of a previous run that are on their way out. */
export async function assertPortFree(port, what, waitMs = 3000) {
  const until = Date.now() + waitMs
  for (;;) {
    if (await canListen(port)) return
    if (Date.now() > until) throw new Failure(`port ${port} on 127.0.0.1 (for ${what}) is in use by another program`)
    await delay(200)
  }
}

function tryConnect(port) {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host: '127.0.0.1' })
    socket.setTimeout(1000)
    socket.once('connect', () => {
      socket.destroy()
      resolve(true)
    })
    socket.once('timeout', () => {
      socket.destroy()
      resolve(false)
    })
    socket.once('error', () => resolve(false))
  })
}

function tryGet(url) {
  return new Promise((resolve) => {
    const request = http.get(url, { timeout: 5000 }, (response) => {
      response.resume()
      resolve(response.statusCode)
    })
    request.once('timeout', () => request.destroy())
    request.once('error', () => resolve(undefined))
  })
}

async function poll(check, { what, timeoutMs, service }) {
  const until = Date.now() + timeoutMs
  for (;;) {
    if (service && !service.running) throw new Failure(`${service.name} stopped before ${what} answered`)
    const result = await check()
    if (result !== undefined && result !== false) return result
    if (Date.now() > until) throw new Failure(`${what} did not answer within ${timeoutMs / 1000} s`)
    await delay(100)
  }
}

/** Waits until something accepts TCP connections on 127.0.0.1:port. */
export function waitForPort(port, { what = `port ${port}`, timeoutMs = 30_000, service } = {}) {
  return poll(() => tryConnect(port), { what, timeoutMs, service })
}

/** Waits until a URL gives any HTTP response; resolves with its status code. */
export function waitForHttp(url, { what = url, timeoutMs = 60_000, service } = {}) {
  return poll(() => tryGet(url), { what, timeoutMs, service })
}
