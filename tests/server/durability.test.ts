import { connect } from 'node:net'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import type { Client } from './client'
import { GOOD_PASSWORD, signUp } from './client'
import { createSite } from './sites-helpers'

// Durability against the shared test server: concurrent writers on one site lose no update, concurrent
// flow-record uploads never leave a mix of two files, and an upload that fails part-way stores nothing.

let owner: Awaited<ReturnType<typeof signUp>>

beforeAll(async () => {
  owner = await signUp('durable')
})

/** A CSV of `days` consecutive days from 2021-01-01, every flow `flow`. */
function flatCsv(days: number, flow: number, start = Date.UTC(2021, 0, 1)) {
  const lines = ['date,flow']
  for (let i = 0; i < days; i++) lines.push(`${new Date(start + i * 86_400_000).toISOString().slice(0, 10)},${flow}`)
  return `${lines.join('\n')}\n`
}

const uploadCsv = (client: Client, siteId: number, text: string, name: string, fields: Record<string, string> = {}) =>
  client.upload(`/api/sites/${siteId}/flow-record`, { file: { name, type: 'text/csv', data: text } }, fields)

/** The stored record and days, as a reader sees them. */
const readRecord = (client: Client, siteId: number) => client.get(`/api/sites/${siteId}/flow-record`)

/** A multipart/form-data body: `parts` in order, each a text field or a file. */
function multipart(boundary: string, parts: { name: string; value: string; fileName?: string }[], close = true) {
  let body = ''
  for (const p of parts) {
    body += `--${boundary}\r\n`
    body += p.fileName
      ? `Content-Disposition: form-data; name="${p.name}"; filename="${p.fileName}"\r\nContent-Type: text/csv\r\n\r\n`
      : `Content-Disposition: form-data; name="${p.name}"\r\n\r\n`
    body += `${p.value}\r\n`
  }
  if (close) body += `--${boundary}--\r\n`
  return Buffer.from(body, 'utf8')
}

/** A session cookie for `email`, signed in with a plain fetch (for the raw-socket requests). */
async function sessionCookie(email: string) {
  const res = await fetch(`${inject('baseURL')}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', accept: 'application/json' },
    body: JSON.stringify({ email, password: GOOD_PASSWORD }),
  })
  expect(res.status).toBe(200)
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ')
}

/**
 * Sends a POST over a raw socket: the head declares `declaredLength` bytes and `body` is written. Then
 * `wait` waits for the reply (the server closes after it: Connection: close), `end` half-closes the
 * socket and `destroy` resets it, as a client that goes away does. Resolves with whatever the server
 * sent back once the connection has closed.
 */
function rawPost(path: string, headers: Record<string, string>, body: Buffer, declaredLength: number, how: 'wait' | 'end' | 'destroy') {
  const url = new URL(inject('baseURL'))
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
        if (how === 'end') socket.end()
        else if (how === 'destroy') socket.destroy()
      })
    })
  })
}

describe('concurrent writers on one site', () => {
  it('ten PATCHes with the same version: exactly one wins, nine get 409, and the winner is what is stored', async () => {
    const site = await createSite(owner.client, owner.orgId, { name: 'Race weir' })
    const names = Array.from({ length: 10 }, (_, i) => `Racer ${i}`)
    const replies = await Promise.all(names.map((name) => owner.client.patch(`/api/sites/${site.id}`, { version: site.version, name })))
    const won = replies.filter((r) => r.status === 200)
    const lost = replies.filter((r) => r.status === 409)
    expect(won).toHaveLength(1)
    expect(lost).toHaveLength(9)
    for (const r of lost) {
      expect(r.body.message).toMatch(/^version: the site was changed by someone else/)
      expect(r.body.data.currentVersion).toBe(site.version + 1)
    }
    const winner = won[0]!.body
    expect(names).toContain(winner.name)
    expect(winner.version).toBe(site.version + 1)
    const stored = await owner.client.get(`/api/sites/${site.id}`)
    expect(stored.body).toMatchObject({ name: winner.name, version: site.version + 1 })
  })

  it('writers of different fields that re-read and retry on 409 all end up in the stored site', async () => {
    const site = await createSite(owner.client, owner.orgId, { name: 'Retry weir' })
    const changes: Record<string, unknown>[] = [
      { name: 'Retry weir, renamed' },
      { riverName: 'Brackwin Water' },
      { notes: 'Survey booked for the spring.' },
      { altitude_m: 212 },
      { targetOxygen_mgL: 7.5 },
      { reach: null },
    ]
    await Promise.all(
      changes.map(async (change) => {
        for (let attempt = 1; ; attempt++) {
          const current = await owner.client.get(`/api/sites/${site.id}`)
          const res = await owner.client.patch(`/api/sites/${site.id}`, { version: current.body.version, ...change })
          if (res.status === 200) return
          expect(res.status, JSON.stringify(res.body)).toBe(409)
          // Bounded, so a server that never lets a writer through fails instead of hanging.
          expect(attempt).toBeLessThan(50)
        }
      }),
    )
    const stored = await owner.client.get(`/api/sites/${site.id}`)
    expect(stored.body).toMatchObject(Object.assign({}, ...changes))
    // One version step per accepted write: every writer's change landed exactly once.
    expect(stored.body.version).toBe(site.version + changes.length)
  })
})

describe('concurrent flow-record uploads on one site', () => {
  /** Every reader's view must be one whole file: the summary, the day count and every flow agree. */
  function expectOneWholeFile(res: Awaited<ReturnType<typeof readRecord>>, files: Map<string, { days: number; flow: number }>) {
    expect(res.status).toBe(200)
    const file = files.get(res.body.record.fileName)
    expect(file, `unknown file ${res.body.record.fileName}`).toBeDefined()
    expect(res.body.record.days).toBe(file!.days)
    expect(res.body.days).toHaveLength(file!.days)
    expect(new Set(res.body.days.map((d: { flow: number }) => d.flow))).toEqual(new Set([file!.flow]))
    expect(res.body.record.stats).toMatchObject({ q50: file!.flow, mean: file!.flow })
  }

  it('replacing at once from six files ends with exactly one of them, whole, and readers never see a mix', async () => {
    const site = await createSite(owner.client, owner.orgId, { name: 'Upload race weir' })
    const files = new Map(Array.from({ length: 6 }, (_, k) => [`flows-${k}.csv`, { days: 400 + 37 * k, flow: k + 1 }]))
    const first = [...files][0]!
    expect((await uploadCsv(owner.client, site.id, flatCsv(first[1].days, first[1].flow), first[0])).status).toBe(201)
    const reads: Promise<Awaited<ReturnType<typeof readRecord>>>[] = []
    const uploads = [...files].map(([name, f]) => {
      reads.push(readRecord(owner.client, site.id))
      return uploadCsv(owner.client, site.id, flatCsv(f.days, f.flow), name)
    })
    const replies = await Promise.all(uploads)
    for (const r of replies) expect(r.status, JSON.stringify(r.body)).toBe(201)
    for (const r of await Promise.all(reads)) expectOneWholeFile(r, files)
    const final = await readRecord(owner.client, site.id)
    expectOneWholeFile(final, files)
    // The last upload to finish is the one stored: its summary is what the store holds.
    const stored = replies.map((r) => r.body.record).find((rec) => rec.fileName === final.body.record.fileName && rec.uploadedAt === final.body.record.uploadedAt)
    expect(stored).toBeDefined()
  })

  it('appending at once from several files keeps every accepted day, and a repeated day is refused, not half-stored', async () => {
    const site = await createSite(owner.client, owner.orgId, { name: 'Append race weir' })
    expect((await uploadCsv(owner.client, site.id, flatCsv(10, 5), 'base.csv')).status).toBe(201)
    // Four files of ten new days each, none overlapping; and two more that both add 2022-06-01.
    const disjoint = Array.from({ length: 4 }, (_, k) => flatCsv(10, 5, Date.UTC(2021, 1 + k, 1)))
    const clashing = [flatCsv(1, 5, Date.UTC(2022, 5, 1)), flatCsv(1, 5, Date.UTC(2022, 5, 1))]
    const replies = await Promise.all([...disjoint, ...clashing].map((text, k) => uploadCsv(owner.client, site.id, text, `add-${k}.csv`, { mode: 'append' })))
    for (const r of replies) expect([201, 409, 422], JSON.stringify(r.body)).toContain(r.status)
    // Of the two files with the same day, at most one is accepted.
    expect(replies.slice(4).filter((r) => r.status === 201).length).toBeLessThanOrEqual(1)
    const accepted = replies.filter((r) => r.status === 201).length
    const acceptedDays = replies.reduce((n, r, k) => n + (r.status === 201 ? (k < 4 ? 10 : 1) : 0), 0)
    expect(accepted).toBeGreaterThan(0)
    const final = await readRecord(owner.client, site.id)
    expect(final.status).toBe(200)
    // The summary and the stored days agree: no append overwrote another's days or counts.
    expect(final.body.record.days).toBe(10 + acceptedDays)
    expect(final.body.days).toHaveLength(10 + acceptedDays)
    const daysSeen = new Set(final.body.days.map((d: { date: string }) => d.date))
    replies.forEach((r, k) => {
      if (r.status !== 201) return
      const first = k < 4 ? new Date(Date.UTC(2021, 1 + k, 1)).toISOString().slice(0, 10) : '2022-06-01'
      expect(daysSeen.has(first)).toBe(true)
    })
    // A refused append is told why, naming the file.
    for (const r of replies.filter((x) => x.status !== 201)) expect(r.body.message).toMatch(/^file: /)
  })
})

describe('an upload that fails part-way stores nothing', () => {
  /** A site with a stored nine-day record, and that record as a reader sees it. */
  async function siteWithRecord(name: string) {
    const site = await createSite(owner.client, owner.orgId, { name })
    expect((await uploadCsv(owner.client, site.id, flatCsv(9, 3), 'kept.csv')).status).toBe(201)
    const before = await readRecord(owner.client, site.id)
    expect(before.status).toBe(200)
    return { site, before }
  }

  it('a bad line near the end of a long file: 422 naming the line, the stored record unchanged', async () => {
    const { site, before } = await siteWithRecord('Bad line weir')
    const lines = flatCsv(3000, 4).trimEnd().split('\n')
    lines.splice(lines.length - 2, 1, '2029-02-30,4')
    const res = await uploadCsv(owner.client, site.id, `${lines.join('\n')}\n`, 'bad-end.csv')
    expect(res.status).toBe(422)
    expect(res.body.data.errors.map((e: { line: number }) => e.line)).toEqual([lines.length - 1])
    expect(await readRecord(owner.client, site.id)).toMatchObject({ status: 200, body: before.body })
    // The same holds for an append whose last line is bad.
    const append = await uploadCsv(owner.client, site.id, 'date,flow\n2030-01-01,2\n2030-01-02,two\n', 'bad-append.csv', { mode: 'append' })
    expect(append.status).toBe(422)
    expect((await readRecord(owner.client, site.id)).body).toEqual(before.body)
  })

  it('a multipart body that ends part-way (no closing boundary) is refused and the record kept', async () => {
    const { site, before } = await siteWithRecord('Cut body weir')
    const cookie = await sessionCookie(owner.email)
    const boundary = 'gillwatt-cut-0123456789'
    const headers = { cookie, 'content-type': `multipart/form-data; boundary=${boundary}`, accept: 'application/json' }
    const path = `/api/sites/${site.id}/flow-record`
    // The file part arrives whole, but the "mode: append" part after it and the closing boundary never do:
    // read as complete, it would replace the record with these two days.
    const whole = multipart(boundary, [{ name: 'file', fileName: 'cut.csv', value: flatCsv(2, 8, Date.UTC(2031, 0, 1)) }, { name: 'mode', value: 'append' }])
    const cut = whole.subarray(0, whole.indexOf(`--${boundary}\r\nContent-Disposition: form-data; name="mode"`) + 30)
    const reply = await rawPost(path, headers, cut, cut.length, 'wait')
    expect(reply).toMatch(/^HTTP\/1\.1 400/)
    expect(reply).toMatch(/ended before its closing boundary|cut short/)
    expect((await readRecord(owner.client, site.id)).body).toEqual(before.body)

    // Cut inside the file itself, at a line end, so what arrived would read as a shorter good file.
    const inFile = multipart(boundary, [{ name: 'file', fileName: 'cut.csv', value: flatCsv(40, 8, Date.UTC(2031, 0, 1)) }], false)
    const atLine = inFile.subarray(0, inFile.indexOf('2031-01-20'))
    expect(await rawPost(path, headers, atLine, atLine.length, 'wait')).toMatch(/^HTTP\/1\.1 400/)
    expect((await readRecord(owner.client, site.id)).body).toEqual(before.body)

    // The same request sent whole is accepted, so it was the cut that was refused.
    const ok = await rawPost(path, headers, whole, whole.length, 'wait')
    expect(ok).toMatch(/^HTTP\/1\.1 201/)
    expect((await readRecord(owner.client, site.id)).body.record.days).toBe(11)
  })

  it('a connection that closes or resets before the declared body has arrived stores nothing', async () => {
    const { site, before } = await siteWithRecord('Dropped upload weir')
    const cookie = await sessionCookie(owner.email)
    const boundary = 'gillwatt-drop-0123456789'
    const headers = { cookie, 'content-type': `multipart/form-data; boundary=${boundary}`, accept: 'application/json' }
    const path = `/api/sites/${site.id}/flow-record`
    const body = multipart(boundary, [{ name: 'file', fileName: 'dropped.csv', value: flatCsv(2000, 6) }])
    for (const how of ['end', 'destroy'] as const) {
      // Declares the whole body, sends 60 % of it (past many complete lines), then the client goes away.
      const reply = await rawPost(path, headers, body.subarray(0, Math.floor(body.length * 0.6)), body.length, how)
      expect(reply).not.toMatch(/^HTTP\/1\.1 2/)
      expect((await readRecord(owner.client, site.id)).body).toEqual(before.body)
    }

    // fetch with a streamed body, aborted by an AbortController after the first half has been sent.
    const controller = new AbortController()
    let sent!: () => void
    const halfSent = new Promise<void>((r) => (sent = r))
    const stream = new ReadableStream<Uint8Array>({
      pull(ctrl) {
        ctrl.enqueue(new Uint8Array(body.subarray(0, body.length >> 1)))
        sent()
        // Nothing more ever comes: the abort below ends the request.
        return new Promise(() => {})
      },
    })
    const request = fetch(`${inject('baseURL')}${path}`, {
      method: 'POST',
      headers,
      body: stream,
      signal: controller.signal,
      duplex: 'half',
    } as RequestInit & { duplex: 'half' })
    await halfSent
    controller.abort()
    await expect(request).rejects.toThrow()
    expect((await readRecord(owner.client, site.id)).body).toEqual(before.body)

    // The server is still well and takes the next good upload.
    expect((await uploadCsv(owner.client, site.id, flatCsv(5, 2), 'after.csv')).status).toBe(201)
    expect((await readRecord(owner.client, site.id)).body.record).toMatchObject({ fileName: 'after.csv', days: 5 })
  })
})
