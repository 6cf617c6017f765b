import Papa from 'papaparse'
import { beforeAll, describe, expect, it } from 'vitest'
import { Client, type UploadFile } from './client'
import { createSite, makeTeam } from './sites-helpers'

let team: Awaited<ReturnType<typeof makeTeam>>
let other: Awaited<ReturnType<typeof makeTeam>>

beforeAll(async () => {
  team = await makeTeam('flows-csv')
  other = await makeTeam('flows-csv-other')
})

const csv = (text: string): UploadFile => ({ name: 'gauge.csv', type: 'text/csv', data: text })
const upload = (client: Client, siteId: number, text: string, fields: Record<string, string> = {}) =>
  client.upload(`/api/sites/${siteId}/flow-record`, { file: csv(text) }, fields)
const download = (client: Client, siteId: number) => client.download(`/api/sites/${siteId}/flow-record.csv`)
const text = (bytes: Uint8Array) => new TextDecoder().decode(bytes)
/** The CSV's lines, the trailing line end dropped. */
const lines = (body: string) => body.replace(/\r\n$/, '').split('\r\n')

describe('GET /api/sites/[id]/flow-record.csv', () => {
  it('downloads every stored day as date,flow_m3s, gaps as empty cells, named after the site', async () => {
    const site = await createSite(team.engineer, team.orgId, { name: 'Skelby mill weir' })
    // Six lines stored, two of them gaps (blank and NA); 2020-03-05 is missing from the file and gets no row.
    const res = await upload(team.engineer, site.id, 'date,flow\n2020-03-01,2.5\n2020-03-02,\n2020-03-03,NA\n2020-03-04,3.25\n2020-03-06,0.125\n2020-03-07,4\n')
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body.record).toMatchObject({ days: 6, gapDays: 2, missingDays: 1 })

    const got = await download(team.viewer, site.id)
    expect(got.status).toBe(200)
    expect(got.headers.get('content-type')).toBe('text/csv; charset=utf-8')
    expect(got.headers.get('content-disposition')).toMatch(/^attachment; filename="Skelby-mill-weir-daily-flows\.csv"/)
    const body = text(got.bytes)
    expect(lines(body)).toEqual(['date,flow_m3s', '2020-03-01,2.5', '2020-03-02,', '2020-03-03,', '2020-03-04,3.25', '2020-03-06,0.125', '2020-03-07,4'])
    expect(lines(body).length - 1).toBe(res.body.record.days)
  })

  it('writes the site flows after area-ratio scaling, as the JSON route gives them', async () => {
    const site = await createSite(team.engineer, team.orgId, { catchment: { siteArea_km2: 30, gaugeArea_km2: 40 } })
    expect((await upload(team.engineer, site.id, 'date,flow\n2021-01-01,1\n2021-01-02,3.3\n2021-01-03,\n')).status).toBe(201)
    const body = text((await download(team.reviewer, site.id)).bytes)
    // Q_site = Q_gauge · A_site / A_gauge (area-ratio method, common practice, no source): 3.3 · 0.75 = 2.475.
    expect(lines(body)).toEqual(['date,flow_m3s', '2021-01-01,0.75', '2021-01-02,2.475', '2021-01-03,'])
    const json = await team.reviewer.get(`/api/sites/${site.id}/flow-record`)
    expect(json.body.days.map((d: { flow: number | null }) => d.flow)).toEqual([0.75, expect.closeTo(2.475, 12), null])
  })

  it('streams a century of days (36,525) in order, one line each, with nothing lost or repeated between chunks', async () => {
    const site = await createSite(team.engineer, team.orgId)
    const rows = ['date,flow']
    const start = Date.UTC(1920, 0, 1)
    for (let i = 0; i < 36_525; i++) {
      const day = new Date(start + i * 86_400_000).toISOString().slice(0, 10)
      rows.push(`${day},${i % 1000 === 999 ? '' : (1 + (i % 50) / 10).toFixed(1)}`)
    }
    const res = await upload(team.engineer, site.id, rows.join('\n'))
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(201)
    const got = await download(team.admin, site.id)
    expect(got.status).toBe(200)
    const parsed = Papa.parse<string[]>(text(got.bytes).trim(), { newline: '\r\n' }).data
    expect(parsed[0]).toEqual(['date', 'flow_m3s'])
    const data = parsed.slice(1)
    expect(data).toHaveLength(res.body.record.days)
    expect(data).toHaveLength(36_525)
    expect(data[0]).toEqual(['1920-01-01', '1'])
    expect(data.at(-1)).toEqual(['2019-12-31', String(1 + (36_524 % 50) / 10)])
    expect(new Set(data.map((r) => r[0])).size).toBe(36_525)
    expect(data.every((r, i) => i === 0 || r[0]! > data[i - 1]![0]!)).toBe(true)
    expect(data.filter((r) => r[1] === '')).toHaveLength(res.body.record.gapDays)
    expect(res.body.record.gapDays).toBe(36)
  })

  it('is open to every role of the organisation; outsiders and other organisations get 404, the signed-out 401', async () => {
    const site = await createSite(team.engineer, team.orgId)
    expect((await download(team.viewer, site.id)).status).toBe(404) // no record yet
    expect((await upload(team.engineer, site.id, 'date,flow\n2020-01-01,1\n2020-01-02,2\n')).status).toBe(201)
    for (const who of ['admin', 'engineer', 'reviewer', 'viewer'] as const) {
      const got = await download(team[who], site.id)
      expect(got.status, who).toBe(200)
      expect(lines(text(got.bytes)), who).toHaveLength(3)
    }
    const outsider = await download(team.outsider, site.id)
    expect(outsider.status).toBe(404)
    expect(text(outsider.bytes)).not.toContain('2020-01-01')
    expect((await download(other.admin, site.id)).status).toBe(404)
    const signedOut = await download(new Client(), site.id)
    expect(signedOut.status).toBe(401)
    expect(text(signedOut.bytes)).not.toContain('2020-01-01')
    expect((await download(team.viewer, 999_999_999)).status).toBe(404)
    const bad = await team.viewer.get('/api/sites/abc/flow-record.csv')
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^id:/)

    // A deleted site's record is gone from every member's view.
    expect((await team.engineer.delete(`/api/sites/${site.id}`)).status).toBe(200)
    expect((await download(team.viewer, site.id)).status).toBe(404)
  })
})
