// Longer than most files: every rule of the flow-record upload, with a hostile-input property at the end.
import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { Client, type UploadFile } from './client'
import { createSite, makeTeam } from './sites-helpers'

let team: Awaited<ReturnType<typeof makeTeam>>
let other: Awaited<ReturnType<typeof makeTeam>>

beforeAll(async () => {
  team = await makeTeam('flows')
  other = await makeTeam('flows-other')
})

const csv = (text: string, name = 'flows.csv', type = 'text/csv'): UploadFile => ({ name, type, data: text })
const upload = (client: Client, siteId: number, file: UploadFile, fields: Record<string, string> = {}) =>
  client.upload(`/api/sites/${siteId}/flow-record`, { file }, fields)

/** Nine days with flows 9 … 1 m³/s: Weibull positions 10 %, 20 % … 90 %. */
const NINE_DAYS = ['date,flow', ...Array.from({ length: 9 }, (_, i) => `2020-01-0${i + 1},${9 - i}`)].join('\n')

describe('POST /api/sites/[id]/flow-record: good files', () => {
  it('stores an ISO, comma-separated file and summarises it', async () => {
    const site = await createSite(team.engineer, team.orgId)
    const res = await upload(team.engineer, site.id, csv(NINE_DAYS))
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ mode: 'replace', daysInFile: 9, gapsInFile: 0 })
    // Weibull P = m/(n+1) with n = 9 puts flow 5 at exactly 50 % and 9 at 10 % (Weibull 1939); Q95 holds the last node, 1.
    expect(res.body.record).toMatchObject({
      fileName: 'flows.csv',
      days: 9,
      gapDays: 0,
      missingDays: 0,
      firstDay: '2020-01-01',
      lastDay: '2020-01-09',
      dateFormat: 'iso',
      dateColumn: 'date',
      flowColumn: 'flow',
      scale: null,
      stats: { q95: 1, q50: 5, q10: 9, mean: 5 },
    })
    const got = await team.viewer.get(`/api/sites/${site.id}/flow-record`)
    expect(got.status).toBe(200)
    expect(got.body.days).toHaveLength(9)
    expect(got.body.days[0]).toEqual({ date: '2020-01-01', flow: 9 })
    const range = await team.viewer.get(`/api/sites/${site.id}/flow-record?from=2020-01-03&to=2020-01-04`)
    expect(range.body.days).toEqual([{ date: '2020-01-03', flow: 7 }, { date: '2020-01-04', flow: 6 }])
    const site2 = await team.viewer.get(`/api/sites/${site.id}`)
    expect(site2.body.hydrologySource).toBe('record')
    expect(site2.body.flowRecord.days).toBe(9)
  })

  it('reads a day-first, semicolon file with decimal commas, comments, CRLF and gaps (blank, -, NA, flagged 12.3*)', async () => {
    const site = await createSite(team.engineer, team.orgId)
    const text = '# Gauge 12, invented\r\nDatum;Abfluss (m³/s)\r\n01/03/2019;2,5\r\n02/03/2019;\r\n03/03/2019;-\r\n04/03/2019;NA\r\n05/03/2019;12,3*\r\n06/03/2019;3,75\r\n'
    const res = await upload(team.engineer, site.id, csv(text, 'gauge.txt', 'text/plain'))
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ daysInFile: 6, gapsInFile: 4, flaggedInFile: 1 })
    expect(res.body.record).toMatchObject({ days: 6, gapDays: 4, dateFormat: 'day-first', firstDay: '2019-03-01', lastDay: '2019-03-06' })
    const got = await team.viewer.get(`/api/sites/${site.id}/flow-record`)
    expect(got.body.days.map((d: { flow: number | null }) => d.flow)).toEqual([2.5, null, null, null, null, 3.75])
  })

  it('reads DD.MM.YYYY dates and a flag column, and takes the columns the caller names', async () => {
    const site = await createSite(team.engineer, team.orgId)
    const text = 'station,when,level,mean flow,qc\nX,30.12.2018,0.4,1.5,G\nX,31.12.2018,0.5,2.5,X\nX,01.01.2019,0.6,3.5,\n'
    const first = await upload(team.engineer, site.id, csv(text))
    // "when" is not named like a date, so the columns must be chosen.
    expect(first.status).toBe(422)
    expect(first.body.data).toMatchObject({ needsColumns: true, header: ['station', 'when', 'level', 'mean flow', 'qc'] })
    const res = await upload(team.engineer, site.id, csv(text), { dateColumn: 'when', flowColumn: 'Mean Flow' })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ daysInFile: 3, gapsInFile: 1, flaggedInFile: 1 })
    expect(res.body.record).toMatchObject({ dateColumn: 'when', flowColumn: 'mean flow', flagColumn: 'qc', firstDay: '2018-12-30', lastDay: '2019-01-01' })
  })

  it('replaces the stored record, or appends new days to it', async () => {
    const site = await createSite(team.engineer, team.orgId)
    expect((await upload(team.engineer, site.id, csv(NINE_DAYS))).status).toBe(201)
    const appended = await upload(team.engineer, site.id, csv('date,flow\n2020-01-12,4\n2020-01-10,3\n'), { mode: 'append' })
    expect(appended.status, JSON.stringify(appended.body)).toBe(201)
    expect(appended.body.record).toMatchObject({ days: 11, firstDay: '2020-01-01', lastDay: '2020-01-12', missingDays: 1 })
    const replaced = await upload(team.admin, site.id, csv('date,flow\n2021-06-01,1\n2021-06-02,2\n2021-06-03,3\n'))
    expect(replaced.status).toBe(201)
    const got = await team.viewer.get(`/api/sites/${site.id}/flow-record`)
    expect(got.body.record).toMatchObject({ days: 3, firstDay: '2021-06-01' })
    expect(got.body.record.uploadedBy.name).toContain('admin')
    expect(got.body.days.map((d: { date: string }) => d.date)).toEqual(['2021-06-01', '2021-06-02', '2021-06-03'])
  })

  it('scales by catchment area: the site\'s catchment, the form\'s areas, or none', async () => {
    const site = await createSite(team.engineer, team.orgId, { catchment: { siteArea_km2: 30, gaugeArea_km2: 60 } })
    const bySite = await upload(team.engineer, site.id, csv(NINE_DAYS))
    expect(bySite.body.record.scale).toEqual({ siteArea_km2: 30, gaugeArea_km2: 60, factor: 0.5 })
    // Q_site = Q_gauge · A_site / A_gauge (area-ratio method, common practice, no source).
    expect(bySite.body.record.stats.q50).toBeCloseTo(2.5, 12)
    expect((await team.viewer.get(`/api/sites/${site.id}/flow-record`)).body.days[0].flow).toBeCloseTo(4.5, 12)
    const byForm = await upload(team.engineer, site.id, csv(NINE_DAYS), { siteArea_km2: '10', gaugeArea_km2: '40' })
    expect(byForm.body.record.scale.factor).toBe(0.25)
    expect(byForm.body.record.stats.mean).toBeCloseTo(1.25, 12)
    const none = await upload(team.engineer, site.id, csv(NINE_DAYS), { scale: 'none' })
    expect(none.body.record).toMatchObject({ scale: null, stats: { mean: 5 } })
    const half = await upload(team.engineer, site.id, csv(NINE_DAYS), { siteArea_km2: '10' })
    expect(half.status).toBe(400)
    expect(half.body.message).toMatch(/^gaugeArea_km2:/)
  })

  it('stores a century of days (36,525 lines) in one go and charts it with at most 200 points', async () => {
    const site = await createSite(team.engineer, team.orgId)
    const lines = ['date,flow']
    const start = Date.UTC(1920, 0, 1)
    for (let i = 0; i < 36_525; i++) {
      const day = new Date(start + i * 86_400_000).toISOString().slice(0, 10)
      lines.push(`${day},${(3 + 2 * Math.sin((2 * Math.PI * i) / 365.25) + (i % 7) / 10).toFixed(3)}`)
    }
    const res = await upload(team.engineer, site.id, csv(lines.join('\n')))
    expect(res.status, JSON.stringify(res.body).slice(0, 500)).toBe(201)
    expect(res.body.record).toMatchObject({ days: 36_525, firstDay: '1920-01-01', lastDay: '2019-12-31', missingDays: 0, years: 100 })
    const hyd = await team.viewer.get(`/api/sites/${site.id}/hydrology`)
    expect(hyd.body.source).toBe('record')
    expect(hyd.body.count).toBe(36_525)
    expect(hyd.body.points.length).toBeLessThanOrEqual(200)
    expect(hyd.body.points.length).toBeGreaterThan(100)
    expect(hyd.body.monthly.map((m: { days: number }) => m.days).reduce((a: number, b: number) => a + b, 0)).toBe(36_525)
    expect(hyd.body.monthly[0].days).toBe(31 * 100)
    expect(hyd.body.stats.q95).toBeLessThan(hyd.body.stats.q50)
    expect(hyd.body.reservedFlow.flow).toBeCloseTo(hyd.body.stats.q95, 12)
  })
})

describe('POST /api/sites/[id]/flow-record: bad files leave the stored record unchanged', () => {
  let siteId: number
  let before: unknown
  beforeAll(async () => {
    siteId = (await createSite(team.engineer, team.orgId)).id
    expect((await upload(team.engineer, siteId, csv(NINE_DAYS))).status).toBe(201)
    before = (await team.viewer.get(`/api/sites/${siteId}/flow-record`)).body
  })
  const unchanged = async () => expect((await team.viewer.get(`/api/sites/${siteId}/flow-record`)).body).toEqual(before)

  it('answers 422 with every bad line by its line number', async () => {
    const text = [
      'date,flow', //                1
      '2020-02-01,3.2', //           2
      '2020-02-02,lots', //          3 text
      '2020-02-03,-1.5', //          4 negative
      '2020-02-30,2', //             5 impossible date
      '2020-02-01,2', //             6 repeats line 2
      '', //                         7 blank: skipped
      '2020-02-05,1e9', //           8 implausible
      '2020-02-06', //               9 too few fields
      '2020-02-07,1.1', //          10 good
    ].join('\n')
    const res = await upload(team.engineer, siteId, csv(text))
    expect(res.status).toBe(422)
    expect(res.body.data.errors.map((e: { line: number }) => e.line)).toEqual([3, 4, 5, 6, 8, 9])
    expect(res.body.data.errors[0].reason).toMatch(/not a number/)
    expect(res.body.data.errors[1].reason).toMatch(/negative/)
    expect(res.body.data.errors[2].reason).toMatch(/does not exist/)
    expect(res.body.data.errors[3].reason).toMatch(/twice.*line 2/)
    expect(res.body.message).toMatch(/^file: line 3:/)
    await unchanged()
  })

  it('answers 422 with the line for a month-first date in a day-first file', async () => {
    const res = await upload(team.engineer, siteId, csv('date;flow\n12/01/2020;1\n01/13/2020;2\n'))
    expect(res.status).toBe(422)
    expect(res.body.data.errors).toEqual([{ line: 3, reason: expect.stringMatching(/no month 13/) }])
    await unchanged()
  })

  it('in append mode, answers 422 for days already stored', async () => {
    const res = await upload(team.engineer, siteId, csv('date,flow\n2020-01-10,1\n2020-01-09,2\n'), { mode: 'append' })
    expect(res.status).toBe(422)
    expect(res.body.data.errors).toEqual([{ line: 3, reason: expect.stringMatching(/already stored/) }])
    await unchanged()
  })

  it('answers 422 with needsColumns and the header when the columns are unclear, and for an unknown named column', async () => {
    const unclear = await upload(team.engineer, siteId, csv('date,flow a,flow b\n2020-01-01,1,2\n'))
    expect(unclear.status).toBe(422)
    expect(unclear.body.data).toEqual({ errors: [], needsColumns: true, header: ['date', 'flow a', 'flow b'] })
    expect(unclear.body.message).toMatch(/^flowColumn:/)
    const unknown = await upload(team.engineer, siteId, csv(NINE_DAYS), { flowColumn: 'discharge' })
    expect(unknown.status).toBe(422)
    expect(unknown.body.message).toMatch(/^flowColumn:.*discharge/)
    const headerless = await upload(team.engineer, siteId, csv('2020-01-01,1\n2020-01-02,2\n'))
    expect(headerless.status).toBe(422)
    expect(headerless.body.data.errors[0].line).toBe(1)
    await unchanged()
  })

  it('answers 400 naming file for a 0-byte file or none, and for a bad form field', async () => {
    const empty = await upload(team.engineer, siteId, csv(''))
    expect(empty.status).toBe(400)
    expect(empty.body.message).toMatch(/^file:.*empty/)
    const none = await team.engineer.upload(`/api/sites/${siteId}/flow-record`, {}, { mode: 'replace' })
    expect(none.status).toBe(400)
    expect(none.body.message).toMatch(/^file:/)
    const badMode = await upload(team.engineer, siteId, csv(NINE_DAYS), { mode: 'merge' })
    expect(badMode.status).toBe(400)
    expect(badMode.body.message).toMatch(/^mode:/)
    expect(badMode.body.data.issues[0].path).toBe('mode')
    await unchanged()
  })

  it('answers 415 for a wrong content type, a binary file, or a body that is not multipart', async () => {
    const png = await upload(team.engineer, siteId, csv(NINE_DAYS, 'flows.png', 'image/png'))
    expect(png.status).toBe(415)
    expect(png.body.message).toMatch(/^file:/)
    const binary = await upload(team.engineer, siteId, { name: 'flows.csv', type: 'text/csv', data: new Uint8Array([0x64, 0x61, 0, 0, 1, 2]) })
    expect(binary.status).toBe(415)
    const json = await team.engineer.post(`/api/sites/${siteId}/flow-record`, { file: NINE_DAYS })
    expect(json.status).toBe(415)
    // A CSV ending is enough when the browser sends no useful type.
    expect((await upload(team.engineer, siteId, csv(NINE_DAYS, 'again.csv', 'application/octet-stream'))).status).toBe(201)
    before = (await team.viewer.get(`/api/sites/${siteId}/flow-record`)).body
  })

  it('answers 413 for a file over 10 MB, by Content-Length and by the size actually read', async () => {
    const big = 'date,flow\n' + '2020-01-01,1.000000\n'.repeat(560_000)
    expect(big.length).toBeGreaterThan(10 * 1024 * 1024)
    const res = await upload(team.engineer, siteId, csv(big))
    expect(res.status).toBe(413)
    expect(res.body.message).toMatch(/^file:.*10 MB/)

    // Streamed without a Content-Length: the server counts what it reads.
    const boundary = 'gillwatt-test-boundary'
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.csv"\r\nContent-Type: text/csv\r\n\r\n`
    const parts = [head, big, `\r\n--${boundary}--\r\n`].map((s) => new TextEncoder().encode(s))
    const body = new ReadableStream<Uint8Array>({
      start(controller) {
        for (const p of parts) controller.enqueue(p)
        controller.close()
      },
    })
    const streamed = await team.engineer.request('POST', `/api/sites/${siteId}/flow-record`, undefined, {
      body,
      headers: { 'content-type': `multipart/form-data; boundary=${boundary}` },
      duplex: 'half',
    } as RequestInit)
    expect(streamed.status).toBe(413)
    await unchanged()
  })
})

describe('flow-record roles', () => {
  it('lets only engineers and admins upload or delete; every member reads; outsiders get 404', async () => {
    const site = await createSite(team.engineer, team.orgId)
    for (const who of ['reviewer', 'viewer'] as const) {
      expect((await upload(team[who], site.id, csv(NINE_DAYS))).status, who).toBe(403)
    }
    expect((await upload(team.outsider, site.id, csv(NINE_DAYS))).status).toBe(404)
    expect((await upload(other.admin, site.id, csv(NINE_DAYS))).status).toBe(404)
    expect((await upload(new Client(), site.id, csv(NINE_DAYS))).status).toBe(401)
    expect((await team.viewer.get(`/api/sites/${site.id}/flow-record`)).status).toBe(404)

    expect((await upload(team.admin, site.id, csv(NINE_DAYS))).status).toBe(201)
    for (const who of ['admin', 'engineer', 'reviewer', 'viewer'] as const) {
      expect((await team[who].get(`/api/sites/${site.id}/flow-record`)).status, who).toBe(200)
    }
    expect((await team.outsider.get(`/api/sites/${site.id}/flow-record`)).status).toBe(404)
    expect((await other.admin.get(`/api/sites/${site.id}/hydrology`)).status).toBe(404)
    expect((await new Client().get(`/api/sites/${site.id}/flow-record`)).status).toBe(401)

    for (const who of ['reviewer', 'viewer'] as const) {
      expect((await team[who].delete(`/api/sites/${site.id}/flow-record`)).status, who).toBe(403)
    }
    expect((await other.admin.delete(`/api/sites/${site.id}/flow-record`)).status).toBe(404)
    expect((await team.viewer.get(`/api/sites/${site.id}/flow-record`)).status).toBe(200)
    expect((await team.engineer.delete(`/api/sites/${site.id}/flow-record`)).status).toBe(200)
    expect((await team.viewer.get(`/api/sites/${site.id}/flow-record`)).status).toBe(404)
    expect((await team.engineer.delete(`/api/sites/${site.id}/flow-record`)).status).toBe(404)
    const hyd = await team.viewer.get(`/api/sites/${site.id}/hydrology`)
    expect(hyd.body.source).toBe('points')

    const log = await team.admin.get(`/api/orgs/${team.orgId}/audit?pageSize=200`)
    const actions = log.body.entries.filter((e: { targetType: string; targetId: number }) => e.targetType === 'site' && e.targetId === site.id).map((e: { action: string }) => e.action)
    expect(actions).toEqual(['flow-record.deleted', 'flow-record.uploaded', 'site.created'])
  })
})

describe('hostile files', () => {
  it('never make the upload answer 5xx, and a refused file never changes the record', async () => {
    const site = await createSite(team.engineer, team.orgId)
    expect((await upload(team.engineer, site.id, csv(NINE_DAYS))).status).toBe(201)
    const cell = fc.oneof(fc.string({ maxLength: 12 }), fc.constantFrom('2020-01-01', '31/12/2019', '1.5', '-2', 'NA', '', '"', ';', ',', '\n'))
    const file = fc.array(fc.array(cell, { maxLength: 4 }).map((cells) => cells.join(',')), { maxLength: 12 }).map((lines) => ['date,flow', ...lines].join('\n'))
    const fields = fc.record({ mode: fc.constantFrom('replace', 'append', 'x'), dateFormat: fc.constantFrom('auto', 'iso', 'day-first', '?'), dateColumn: fc.string({ maxLength: 8 }) }, { requiredKeys: [] })
    await fc.assert(
      fc.asyncProperty(file, fields, async (text, form) => {
        const before = (await team.viewer.get(`/api/sites/${site.id}/flow-record`)).body
        const res = await upload(team.engineer, site.id, csv(text), form)
        expect(res.status, JSON.stringify({ text, form })).toBeLessThan(500)
        if (res.status >= 400) {
          expect(typeof res.body?.message).toBe('string')
          expect((await team.viewer.get(`/api/sites/${site.id}/flow-record`)).body).toEqual(before)
        }
      }),
      { numRuns: 60 },
    )
  })
})
