import { connect } from 'node:net'
import { describe, expect, inject, it } from 'vitest'
import { Client, signUp } from './client'
import { createSite } from './sites-helpers'

// Bodies are read with a limit counted on the bytes received, after the route has checked who is
// calling; JSON routes take JSON only; requests from other sites' pages cannot change anything;
// ids are plain digits; signed-in answers are never cached.

/**
 * Sends a chunked JSON body (no Content-Length) of up to `totalBytes` over a raw socket, stopping as
 * soon as an answer arrives; resolves with the status, the answer's body and how many bytes had been
 * written by then. A raw socket keeps the answer even when the server closes the connection while
 * the client is still writing (the write then fails, the answer is already in).
 */
function sendChunked(path: string, totalBytes: number): Promise<{ status: number; sent: number; body: string }> {
  const url = new URL(path, inject('baseURL'))
  return new Promise((resolve, reject) => {
    let sent = 0
    let received = ''
    let done = false
    const socket = connect(Number(url.port), url.hostname)
    const finish = () => {
      if (done) return
      const head = /^HTTP\/1\.1 (\d{3})[\s\S]*?\r\n\r\n([\s\S]*)$/.exec(received)
      if (!head) return
      // The body is one chunk (or a Content-Length body): its JSON object is between the braces.
      const json = /\{[\s\S]*\}/.exec(head[2]!)?.[0]
      if (!json) return
      done = true
      socket.destroy()
      resolve({ status: Number(head[1]), sent, body: json })
    }
    socket.on('data', (d) => {
      received += d.toString('utf8')
      finish()
    })
    socket.on('error', () => finish())
    socket.on('close', () => {
      finish()
      if (!done) reject(new Error(`no answer; got: ${received.slice(0, 200)}`))
    })
    socket.on('connect', () => {
      socket.write(`POST ${url.pathname} HTTP/1.1\r\nHost: ${url.host}\r\nContent-Type: application/json\r\nTransfer-Encoding: chunked\r\n\r\n`)
      const chunk = Buffer.alloc(256 * 1024, 'a')
      const frame = Buffer.concat([Buffer.from(`${chunk.length.toString(16)}\r\n`), chunk, Buffer.from('\r\n')])
      const pump = () => {
        while (!done && !socket.destroyed && sent < totalBytes) {
          sent += chunk.length
          if (!socket.write(frame)) return void socket.once('drain', pump)
        }
        if (!done && !socket.destroyed) socket.write('0\r\n\r\n')
      }
      pump()
    })
  })
}

describe('request bodies', () => {
  it('a huge chunked body before sign-in gets 413 without being read whole, and the server keeps answering', async () => {
    const total = 600 * 1024 * 1024
    const res = await sendChunked('/api/auth/login', total)
    expect(res.status).toBe(413)
    expect(JSON.parse(res.body).message).toMatch(/^body: is larger than the 8 kB limit/)
    expect(res.sent).toBeLessThan(total)
    expect((await new Client().get('/api/health')).status).toBe(200)
  })

  it('PATCH bodies are limited too, with or without a Content-Length', async () => {
    const { client, orgId } = await signUp('limits-patch')
    const site = await createSite(client, orgId)
    const big = JSON.stringify({ version: site.version, notes: 'x'.repeat(400 * 1024) })
    const res = await client.request('PATCH', `/api/sites/${site.id}`, big)
    expect(res.status).toBe(413)
    expect(res.body.message).toMatch(/^body: is larger than the 256 kB limit/)
    // A signed-out caller is refused before its body is read.
    expect((await new Client().request('PATCH', `/api/sites/${site.id}`, big)).status).toBe(401)
  })

  it('JSON routes refuse form-encoded and text bodies with 415 naming the body', async () => {
    const client = new Client()
    for (const type of ['application/x-www-form-urlencoded', 'text/plain', 'multipart/form-data; boundary=x']) {
      const res = await client.request('POST', '/api/auth/login', undefined, { body: 'email=a%40b.example&password=whatever12', headers: { 'content-type': type } })
      expect(res.status, type).toBe(415)
      expect(res.body.message, type).toMatch(/^body: send JSON/)
    }
  })
})

describe('requests from other sites', () => {
  it('are refused with 403 when they would change something', async () => {
    const { client, orgId } = await signUp('origin')
    const refused: Record<string, string>[] = [{ origin: 'https://elsewhere.example' }, { 'sec-fetch-site': 'cross-site' }, { origin: 'null' }]
    for (const headers of refused) {
      const res = await client.request('POST', `/api/orgs/${orgId}/sites`, '{}', { headers })
      expect(res.status, JSON.stringify(headers)).toBe(403)
      expect(res.body.message).toMatch(/^origin:/)
    }
    // The app's own pages (same origin) go through to the route.
    const own = await client.request('POST', `/api/orgs/${orgId}/sites`, '{}', { headers: { origin: inject('baseURL'), 'sec-fetch-site': 'same-origin' } })
    expect(own.status).toBe(400)
    // Reading is not refused.
    expect((await client.request('GET', '/api/me', undefined, { headers: { origin: 'https://elsewhere.example' } })).status).toBe(200)
  })
})

describe('ids', () => {
  it('must be plain digits: 0x1, 1e0, +1 and " 1" are not 1', async () => {
    const { client, orgId } = await signUp('ids')
    const site = await createSite(client, orgId)
    expect((await client.get(`/api/sites/${site.id}`)).status).toBe(200)
    for (const id of ['0x1', '1e0', '+1', '%201', '1.0', `${site.id}.0`]) {
      const res = await client.get(`/api/sites/${id}`)
      expect(res.status, id).toBe(400)
      expect(res.body.message, id).toMatch(/^id:/)
    }
    expect((await client.get(`/api/orgs/${orgId}/sites?page=0x1`)).status).toBe(400)
  })
})

describe('signed-in answers', () => {
  it('are never stored by caches: JSON and CSV carry Cache-Control: no-store', async () => {
    const { client, orgId } = await signUp('nostore')
    const site = await createSite(client, orgId)
    expect((await client.get('/api/me')).headers.get('cache-control')).toBe('no-store')
    const csv = await client.get(`/api/orgs/${orgId}/portfolio?format=csv`)
    expect(csv.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(csv.headers.get('cache-control')).toBe('no-store')
    expect((await client.get(`/api/sites/${site.id}`)).headers.get('cache-control')).toBe('no-store')
  })

  it('401 says Unauthorized, not Server Error', async () => {
    const res = await new Client().get('/api/me')
    expect(res.status).toBe(401)
    expect(res.body.statusMessage).toBe('Unauthorized')
  })
})

describe('a refused chunked body that never ends', () => {
  it('is dropped for a short grace only: the server cuts the connection itself', async () => {
    const url = new URL('/api/auth/login', inject('baseURL'))
    const outcome = await new Promise<{ status: number; cut: boolean; sent: number }>((resolve) => {
      let received = ''
      let sent = 0
      let stop = false
      const socket = connect(Number(url.port), url.hostname)
      const chunk = Buffer.alloc(64 * 1024, 'a')
      const frame = Buffer.concat([Buffer.from(`${chunk.length.toString(16)}\r\n`), chunk, Buffer.from('\r\n')])
      const finish = (cut: boolean) => {
        if (stop) return
        stop = true
        clearInterval(timer)
        socket.destroy()
        resolve({ status: Number(/^HTTP\/1\.1 (\d{3})/.exec(received)?.[1] ?? 0), cut, sent })
      }
      // Keeps sending slowly after the answer, as an endless hostile body would, for up to 20 s.
      const timer = setInterval(() => {
        if (!socket.destroyed && socket.writable) {
          sent += chunk.length
          socket.write(frame)
        }
      }, 20)
      const deadline = setTimeout(() => finish(false), 20_000)
      socket.on('data', (d) => (received += d.toString('utf8')))
      socket.on('error', () => undefined)
      socket.on('close', () => {
        clearTimeout(deadline)
        finish(true)
      })
      socket.on('connect', () => socket.write(`POST ${url.pathname} HTTP/1.1\r\nHost: ${url.host}\r\nContent-Type: application/json\r\nTransfer-Encoding: chunked\r\n\r\n`))
    })
    expect(outcome.status).toBe(413)
    expect(outcome.cut).toBe(true)
    expect((await new Client().get('/api/health')).status).toBe(200)
  })
})
