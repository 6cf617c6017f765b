import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import type { Client } from './client'
import { expectSafe, HUGE_TEXT, numberishText, orgRows, show } from './hostile-arbitraries'
import { createSite, makeTeam } from './sites-helpers'

// Hostile multipart requests to the two upload routes (attachments, daily flow record): wrong or
// missing parts, parts without a file name, several file parts, broken boundaries, other content
// types, hostile file names and form fields. Never a 5xx, always a message, and a refused upload
// leaves the stored files and record as they were.

let team: Awaited<ReturnType<typeof makeTeam>>
let siteId: number

const GOOD_CSV = ['date,flow', ...Array.from({ length: 9 }, (_, i) => `2020-01-0${i + 1},${9 - i}`)].join('\n')

beforeAll(async () => {
  team = await makeTeam('hostile-up')
  siteId = (await createSite(team.engineer, team.orgId)).id
  const res = await team.engineer.upload(`/api/sites/${siteId}/flow-record`, { file: { name: 'flows.csv', type: 'text/csv', data: GOOD_CSV } })
  expect(res.status, show(res.body)).toBe(201)
})

interface Part {
  name?: string
  filename?: string
  type?: string
  data: string | Uint8Array
}

/** A multipart body written by hand, so part headers can be wrong in ways FormData never writes. */
function multipart(parts: Part[], boundary: string): Uint8Array<ArrayBuffer> {
  const chunks: Buffer[] = []
  for (const p of parts) {
    const disposition = ['form-data', p.name !== undefined ? `name="${p.name}"` : null, p.filename !== undefined ? `filename="${p.filename}"` : null].filter(Boolean).join('; ')
    chunks.push(Buffer.from(`--${boundary}\r\nContent-Disposition: ${disposition}\r\n${p.type ? `Content-Type: ${p.type}\r\n` : ''}\r\n`))
    chunks.push(Buffer.from(p.data))
    chunks.push(Buffer.from('\r\n'))
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`))
  return new Uint8Array(Buffer.concat(chunks))
}

const send = (client: Client, path: string, body: Uint8Array<ArrayBuffer> | string, contentType: string | null) =>
  client.request('POST', path, undefined, { body, headers: contentType === null ? {} : { 'content-type': contentType } })

/** Bytes no attachment sniffer takes: they start with "X", or are empty. */
const notAFile = fc.oneof(fc.uint8Array({ maxLength: 200 }).map((b) => new Uint8Array([0x58, ...b])), fc.constant(new Uint8Array(0)), fc.constantFrom('X<html></html>', 'X%PDF-1.4 lies', `X${HUGE_TEXT}`))

const fileName = fc.oneof(fc.string({ maxLength: 30 }), fc.constantFrom('', '../../etc/passwd', 'a\\b\\c.png', 'x'.repeat(5000), 'weir.png', 'flows.csv', 'résumé.pdf', '\u0000.png', 'a;b=c.csv'))
const partName = fc.constantFrom('file', 'File', 'files', 'file[]', '', 'note', 'mode')
const partType = fc.constantFrom('', 'image/png', 'application/pdf', 'text/csv', 'text/plain', 'application/octet-stream', 'multipart/form-data', 'text/csv; charset=utf-16')

const part = (data: fc.Arbitrary<string | Uint8Array>): fc.Arbitrary<Part> =>
  fc.record({ name: fc.option(partName, { nil: undefined }), filename: fc.option(fileName, { nil: undefined }), type: fc.option(partType, { nil: undefined }), data }, { requiredKeys: ['data'] })

/** A whole request: hand-written multipart with a good or wrong boundary, or another content type. */
const request = (data: fc.Arbitrary<string | Uint8Array>, extraParts: fc.Arbitrary<Part[]> = fc.constant([])) =>
  fc.oneof(
    { weight: 4, arbitrary: fc.tuple(fc.array(part(data), { maxLength: 4 }), extraParts).map(([parts, extra]) => ({ body: multipart([...parts, ...extra], 'hostileBoundary42'), type: 'multipart/form-data; boundary=hostileBoundary42' as string | null })) },
    { weight: 1, arbitrary: fc.array(part(data), { minLength: 1, maxLength: 3 }).map((parts) => ({ body: multipart(parts, 'one'), type: 'multipart/form-data; boundary=another' as string | null })) },
    { weight: 1, arbitrary: fc.array(part(data), { minLength: 1, maxLength: 3 }).map((parts) => ({ body: multipart(parts, 'one'), type: 'multipart/form-data' as string | null })) },
    { weight: 1, arbitrary: fc.tuple(fc.string({ maxLength: 200 }), fc.constantFrom('application/json', 'text/csv', 'application/x-www-form-urlencoded', 'multipart/mixed; boundary=x', null)).map(([body, type]) => ({ body: body as Uint8Array<ArrayBuffer> | string, type })) },
  )

describe('hostile uploads', () => {
  it('attachments: every one refused with a message, and no file stored', async () => {
    const path = `/api/sites/${siteId}/attachments`
    const before = orgRows(team.orgId, ['audit_log'])
    const list = async () => (await team.viewer.get(`/api/sites/${siteId}/attachments`)).body
    const stored = await list()
    await fc.assert(
      fc.asyncProperty(request(notAFile), async ({ body, type }) => {
        const res = await send(team.engineer, path, body, type)
        expectSafe(res, `${type} ${show(new TextDecoder().decode(body instanceof Uint8Array ? body.slice(0, 300) : new TextEncoder().encode(body.slice(0, 300))))}`)
        expect(res.status, show(res.body)).toBeGreaterThanOrEqual(400)
      }),
      { numRuns: 100 },
    )
    expect(await list()).toEqual(stored)
    expect(orgRows(team.orgId, ['audit_log'])).toEqual(before)
  })

  it('flow record: wrong parts and hostile fields are refused with a message, and a refused upload keeps the record', async () => {
    const path = `/api/sites/${siteId}/flow-record`
    const csvText = fc.oneof(fc.constant(GOOD_CSV), fc.constantFrom('date,flow\n2020-02-30,1', 'date;flow\n01/02/2020;1,5', '\uFEFFdate,flow\n2020-01-01,NaN', 'date,flow\n2020-01-01,1e999', 'date,flow\n2020-01-01,-0', 'date,flow\n2020-01-01,Infinity', ''), fc.uint8Array({ maxLength: 100 }))
    const FIELDS = ['mode', 'dateFormat', 'scale', 'siteArea_km2', 'gaugeArea_km2', 'dateColumn', 'flowColumn']
    const fields = fc.array(fc.tuple(fc.constantFrom(...FIELDS), fc.oneof(numberishText, fc.constantFrom('replace', 'append', 'auto', 'none', 'iso', 'day-first', 'date', 'flow', '1000000', '1000001', '5e-324')))).map((pairs) =>
      pairs.map(([name, data]): Part => ({ name, data })),
    )
    const record = async () => (await team.viewer.get(`/api/sites/${siteId}/flow-record`)).body
    let kept = await record()
    await fc.assert(
      fc.asyncProperty(request(csvText, fields), async ({ body, type }) => {
        const res = await send(team.engineer, path, body, type)
        expectSafe(res, `${type} ${show(new TextDecoder().decode(body instanceof Uint8Array ? body.slice(0, 400) : new TextEncoder().encode(body.slice(0, 400))))}`)
        const now = await record()
        if (res.status >= 400) expect(now, 'a refused upload changed the record').toEqual(kept)
        else {
          expect(res.status).toBe(201)
          expect(now.record.dayCount ?? now.days.length).toBeGreaterThan(0)
        }
        kept = now
      }),
      { numRuns: 80 },
    )
  })
})
