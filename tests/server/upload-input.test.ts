import { beforeAll, describe, expect, it } from 'vitest'
import type { Client } from './client'
import { createSite, makeTeam } from './sites-helpers'

// What an upload keeps of what was sent: file names with `;`, `=` and non-ASCII letters as given, and
// a refusal of bad CSV lines that names them without echoing megabytes of the file back.

let team: Awaited<ReturnType<typeof makeTeam>>
let siteId: number

beforeAll(async () => {
  team = await makeTeam('upload-input')
  siteId = (await createSite(team.engineer, team.orgId)).id
})

const PNG = Uint8Array.from(Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64'))
const GOOD_CSV = 'date,flow\n2020-01-01,1.5\n2020-01-02,2.5\n'

const sendCsv = (client: Client, text: string, name = 'flows.csv') => client.upload(`/api/sites/${siteId}/flow-record`, { file: { name, type: 'text/csv', data: text } })

describe('file names are kept as sent', () => {
  for (const name of ['a;b=c.csv', 'gauge; station=7.csv', 'café.csv', 'débit;=x.txt']) {
    it(`flow record named ${JSON.stringify(name)}`, async () => {
      const res = await sendCsv(team.engineer, GOOD_CSV, name)
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      expect(res.body.record.fileName).toBe(name)
      expect((await team.viewer.get(`/api/sites/${siteId}/flow-record`)).body.record.fileName).toBe(name)
    })
  }

  for (const name of ['weir;north=1.png', 'crête=été.png']) {
    it(`attachment named ${JSON.stringify(name)}`, async () => {
      const res = await team.engineer.upload(`/api/sites/${siteId}/attachments`, { file: { name, type: 'image/png', data: PNG } })
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      expect(res.body.originalName).toBe(name)
    })
  }
})

describe('a refused CSV does not echo what it refuses', () => {
  const NINE_MB = 9 * 1024 * 1024
  const cases = [
    { what: 'a 9 MB flow cell', text: `date,flow\n2020-01-01,${'9x'.repeat(NINE_MB / 2)}\n`, status: 422 },
    { what: 'a 9 MB date cell', text: `date,flow\n2020-01-01${'7'.repeat(NINE_MB)},1\n`, status: 422 },
    { what: 'a 9 MB header cell', text: `date,${'h'.repeat(NINE_MB)},note\n2020-01-01,1,x\n`, status: 422 },
    { what: 'a 9 MB line of one field', text: `date,flow\n${'z'.repeat(NINE_MB)}\n`, status: 422 },
  ]
  for (const { what, text, status } of cases) {
    it(`${what}: ${status} naming the line, message and data under a few kB`, async () => {
      const res = await sendCsv(team.engineer, text)
      expect(res.status).toBe(status)
      expect(res.body.message).toMatch(/^(file|flowColumn|dateColumn): /)
      expect(res.body.message.length).toBeLessThan(600)
      const size = JSON.stringify(res.body).length
      expect(size, JSON.stringify(res.body).slice(0, 400)).toBeLessThan(4096)
    })
  }

  it('a file of 50,000 short bad lines: every one counted, the list in the reply capped', async () => {
    const text = `date,flow\n${'2020-01-01\n'.repeat(50_000)}`
    const res = await sendCsv(team.engineer, text)
    expect(res.status).toBe(422)
    expect(res.body.message).toMatch(/^file: line 2: .*\(and 49999 more lines\)/)
    expect(res.body.data.errorCount).toBe(50_000)
    expect(res.body.data.errors.length).toBeLessThanOrEqual(1000)
    expect(res.body.data.errors[0]).toEqual({ line: 2, reason: expect.stringMatching(/1 field/) })
  })
})
