import { mkdirSync, mkdtempSync, renameSync, rmSync, utimesSync, writeFileSync } from 'node:fs'
import { connect } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { type BuiltServer, startBuiltServer } from '../../scripts/builtServer.mjs'
import { Client, GOOD_PASSWORD, uniqueEmail } from './client'
import { createSite } from './sites-helpers'
import { chunkedUpload } from '../../scripts/lib/chunkedUpload'
import { attachmentKey, eventually, expectNoStrayFiles, filesUnder, residentBytes, watchResident } from './upload-helpers'

// Uploads against a server of this file's own, whose process and uploads folder the tests can see:
// a chunked 150 MB file part is cut off at the limit without the server's memory growing; no refused,
// cut or killed upload leaves a file behind; deleting an attachment deletes its file; and a restart
// sweeps away files left by a crash.

const dir = mkdtempSync(join(tmpdir(), 'gillwatt-upload-limits-'))
const SESSION_PASSWORD = 'upload-limits-test-session-password-0123456789'
let server: BuiltServer
let owner: Client
let email: string
let orgId: number
let siteId: number

const MB = 1024 * 1024
// A real 1×1 PNG.
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64')

async function start() {
  server = await startBuiltServer({ dir, sessionPassword: SESSION_PASSWORD })
  owner = new Client(server.baseURL)
}

beforeAll(async () => {
  await start()
  email = uniqueEmail('limits')
  expect((await owner.post('/api/auth/signup', { name: 'Test limits', email, password: GOOD_PASSWORD, organisationName: 'Org of limits' })).status).toBe(202)
  const res = await owner.post('/api/auth/login', { email, password: GOOD_PASSWORD })
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  orgId = res.body.memberships[0].orgId
  siteId = (await createSite(owner, orgId)).id
})

afterAll(async () => {
  await server?.stop()
  rmSync(dir, { recursive: true, force: true })
})

const pid = () => server.child.pid!
const attach = (data: Uint8Array | string, name = 'photo.png', site = siteId) => owner.upload(`/api/sites/${site}/attachments`, { file: { name, type: 'image/png', data } })
const noStrayFiles = () => expectNoStrayFiles(server.uploadsDir, server.databasePath)

/**
 * Sends a POST over a raw socket declaring `declaredLength` bytes, writes `body`, then either waits for
 * the reply or resets the connection as a client that goes away does.
 */
function rawPost(path: string, headers: Record<string, string>, body: Buffer, declaredLength: number, how: 'wait' | 'destroy') {
  const url = new URL(server.baseURL)
  return new Promise<string>((resolve, reject) => {
    const socket = connect(Number(url.port), url.hostname)
    let reply = ''
    socket.setEncoding('utf8')
    socket.on('data', (d: string) => (reply += d))
    socket.on('error', (e: NodeJS.ErrnoException) => (e.code === 'ECONNRESET' || e.code === 'EPIPE' ? undefined : reject(e)))
    socket.on('close', () => resolve(reply))
    socket.on('connect', () => {
      const head = [`POST ${path} HTTP/1.1`, `Host: ${url.host}`, `Content-Length: ${declaredLength}`, 'Connection: close', ...Object.entries(headers).map(([k, v]) => `${k}: ${v}`)]
      socket.write(`${head.join('\r\n')}\r\n\r\n`)
      socket.write(body, () => {
        if (how === 'destroy') setTimeout(() => socket.destroy(), 100)
      })
    })
  })
}

/** A multipart body with one PNG file part of `bytes` bytes, optionally without its closing boundary. */
function pngMultipart(boundary: string, bytes: number, close = true) {
  const file = Buffer.alloc(bytes, 0x61)
  PNG.copy(file)
  return Buffer.concat([
    Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="cut.png"\r\nContent-Type: image/png\r\n\r\n`),
    file,
    Buffer.from(close ? `\r\n--${boundary}--\r\n` : '\r\n'),
  ])
}

describe('a chunked upload far over the limit', () => {
  const routes = [
    { route: 'flow-record', limit: '10 MB', fileName: 'flows.csv', type: 'text/csv', head: 'date,flow\n2020-01-01,' },
    { route: 'attachments', limit: '20 MB', fileName: 'photo.png', type: 'image/png', head: PNG },
  ]
  for (const { route, limit, fileName, type, head } of routes) {
    it(`${route}: 150 MB sent chunked answers 413 at the ${limit} limit; the server lives on and its memory grows by under 100 MB`, async () => {
      const before = residentBytes(pid())
      const memory = watchResident(pid())
      const reply = await chunkedUpload(`${server.baseURL}/api/sites/${siteId}/${route}`, owner.cookieHeader(), { fileName, type, head, fileBytes: 150 * MB })
      const most = memory.stop()
      expect(reply.status, JSON.stringify(reply.body).slice(0, 300)).toBe(413)
      expect(reply.body.message).toBe(`file: is larger than the ${limit} limit`)
      // Answered while the body was still coming: the server neither read it all nor waited for it.
      expect(reply.sentAll).toBe(false)
      expect(reply.sentBytes).toBeLessThan(100 * MB)
      expect((await fetch(`${server.baseURL}/api/health`)).status).toBe(200)
      expect(most - before, `resident memory grew from ${(before / MB).toFixed(0)} MB to ${(most / MB).toFixed(0)} MB`).toBeLessThan(100 * MB)
      await noStrayFiles()
    })
  }

  it('a file just under the limit is still accepted after them', async () => {
    const reply = await chunkedUpload(`${server.baseURL}/api/sites/${siteId}/attachments`, owner.cookieHeader(), { fileName: 'big.png', type: 'image/png', head: PNG, fileBytes: 20 * MB })
    expect(reply.status, JSON.stringify(reply.body)).toBe(201)
    expect(reply.body.sizeBytes).toBe(20 * MB)
    await noStrayFiles()
  })
})

describe('upload files never leak', () => {
  it('a refused, cut or killed attachment upload leaves no file', async () => {
    expect((await attach('just text, not an image')).status).toBe(415)
    await noStrayFiles()
    expect((await attach(new Uint8Array(0))).status).toBe(400)
    await noStrayFiles()

    const boundary = 'gillwatt-leak-0123456789'
    const headers = { cookie: owner.cookieHeader(), 'content-type': `multipart/form-data; boundary=${boundary}`, accept: 'application/json' }
    const path = `/api/sites/${siteId}/attachments`
    // Cut short: the whole file arrives, its closing boundary never does.
    const cut = pngMultipart(boundary, 2 * MB, false)
    expect(await rawPost(path, headers, cut, cut.length, 'wait')).toMatch(/^HTTP\/1\.1 400/)
    await noStrayFiles()
    // Killed: 3 MB declared, 1 MB sent, then the connection is reset mid-file.
    const whole = pngMultipart(boundary, 3 * MB)
    expect(await rawPost(path, headers, whole.subarray(0, MB), whole.length, 'destroy')).not.toMatch(/^HTTP\/1\.1 2/)
    await noStrayFiles()
    // The same upload sent whole is stored: the folder then holds exactly its file.
    expect(await rawPost(path, headers, whole, whole.length, 'wait')).toMatch(/^HTTP\/1\.1 201/)
    await noStrayFiles()
  })

  it('deleting an attachment deletes its file; a deleted site keeps its attachments for a restore', async () => {
    const png = (await attach(PNG, 'gone.png')).body
    expect(filesUnder(server.uploadsDir).length).toBeGreaterThan(0)
    const before = filesUnder(server.uploadsDir)
    expect((await owner.delete(`/api/attachments/${png.id}`)).status).toBe(200)
    expect(filesUnder(server.uploadsDir)).toHaveLength(before.length - 1)
    await noStrayFiles()

    const site = await createSite(owner, orgId, { name: 'Deleted then restored weir' })
    const kept = (await attach(PNG, 'kept.png', site.id)).body
    expect((await owner.delete(`/api/sites/${site.id}`)).status).toBe(200)
    await noStrayFiles()
    expect((await owner.post(`/api/sites/${site.id}/restore`)).status).toBe(200)
    const back = await owner.download(`/api/attachments/${kept.id}`)
    expect(back.status).toBe(200)
    expect(Buffer.from(back.bytes).equals(PNG)).toBe(true)
  })

  it('a restart removes stray and old pending files, keeps fresh pending ones, and finishes a stored upload left pending', async () => {
    const survivor = (await attach(PNG, 'survivor.png')).body
    const crashed = (await attach(PNG, 'crashed.png')).body
    const crashedKey = attachmentKey(server.databasePath, crashed.id)
    await server.stop()

    const uploads = server.uploadsDir
    const pending = join(uploads, '.pending')
    mkdirSync(pending, { recursive: true })
    const anHourAgo = new Date(Date.now() - 3600_000)
    // A file no row names, and an old pending file no row names: both go.
    writeFileSync(join(uploads, 'stray-file-no-row'), 'stray')
    writeFileSync(join(pending, 'old-pending-no-row'), 'old')
    utimesSync(join(pending, 'old-pending-no-row'), anHourAgo, anHourAgo)
    // A pending file written a moment ago may be another server's upload in flight: it stays.
    writeFileSync(join(pending, 'fresh-pending'), 'fresh')
    // A crash after the row was stored but before the file took its final name: the file is kept.
    renameSync(join(uploads, crashedKey), join(pending, crashedKey))
    utimesSync(join(pending, crashedKey), anHourAgo, anHourAgo)

    await start()
    await eventually(() => !filesUnder(uploads).includes('stray-file-no-row'), 'the stray file is removed at start')
    await eventually(() => !filesUnder(uploads).includes('.pending/old-pending-no-row'), 'the old pending file is removed at start')
    await eventually(() => filesUnder(uploads).includes(crashedKey), 'the stored upload left pending takes its final name')
    expect(filesUnder(uploads)).toContain('.pending/fresh-pending')
    rmSync(join(pending, 'fresh-pending'))
    await noStrayFiles()

    const again = new Client(server.baseURL)
    expect((await again.post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(200)
    for (const a of [survivor, crashed]) {
      const res = await again.download(`/api/attachments/${a.id}`)
      expect(res.status, a.originalName).toBe(200)
      expect(Buffer.from(res.bytes).equals(PNG)).toBe(true)
    }
  })
})
