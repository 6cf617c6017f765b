import { beforeAll, describe, expect, it } from 'vitest'
import { draft, numbersIn, record } from '../unit/engine/fixtures'
import { Client, signUp } from './client'

let client: Client
beforeAll(async () => {
  client = (await signUp('engine')).client
})

describe('POST /api/engine/assess', () => {
  it('answers 401 when signed out', async () => {
    expect((await new Client().post('/api/engine/assess', draft())).status).toBe(401)
  })

  it('runs the engine on a valid input, with the engine version and only finite numbers', async () => {
    const res = await client.post('/api/engine/assess', draft())
    expect(res.status).toBe(200)
    expect(res.body.engineVersion).toMatch(/^\d+\.\d+\.\d+$/)
    expect(res.body.summary.annualEnergy_MWh).toBeGreaterThan(0)
    expect(res.body.months).toHaveLength(12)
    expect(numbersIn(res.body).filter(([, n]) => !Number.isFinite(n))).toEqual([])
  })

  it('answers 400 naming the field for a malformed input', async () => {
    const bad = draft()
    bad.option.throatDiameter_m = -1
    const res = await client.post('/api/engine/assess', bad)
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^option\.throatDiameter_m:/)

    const text = draft() as unknown as { site: { grossHead_m: unknown } }
    text.site.grossHead_m = 'two metres'
    const res2 = await client.post('/api/engine/assess', text)
    expect(res2.status).toBe(400)
    expect(res2.body.message).toMatch(/^site\.grossHead_m:/)
  })

  it('answers 413 for a body over the limit', async () => {
    const res = await client.request('POST', '/api/engine/assess', JSON.stringify({ pad: 'x'.repeat(9 * 1024 * 1024) }))
    expect(res.status).toBe(413)
    expect(res.body.message).toMatch(/^body:/)
  })
})

describe('POST /api/engine/sweep and /api/engine/sensitivity', () => {
  it('sweep returns every grid point and names the best safe one', async () => {
    const grid = { throatDiameters_m: [0.4, 0.6], units: [1, 2], throatDepths_m: [1, 1.5] }
    const res = await client.post('/api/engine/sweep', { input: draft(), grid })
    expect(res.status).toBe(200)
    expect(res.body.points).toHaveLength(8)
  })

  it('sweep names the body field, under `input.`, when the engine refuses a value the schema let through', async () => {
    const input = draft()
    input.option.throatDiameter_m = Number.MIN_VALUE
    const grid = { throatDiameters_m: [0.4, 0.6], units: [1, 2], throatDepths_m: [1, 1.5] }
    const res = await client.post('/api/engine/sweep', { input, grid })
    expect(res.status).toBe(422)
    expect(res.body.message).toMatch(/^input\.option\.throatDiameter_m: /)
    expect(res.body.data.issues).toEqual([{ path: 'input.option.throatDiameter_m', message: expect.any(String) }])
  })

  it('sensitivity names the body field, under `input.`, when the engine refuses a day of the record', async () => {
    const days = record('2001-01-01', [1, 2, 3]).map((d, i) => (i === 1 ? { ...d, date: '2001-13-01' } : d))
    const res = await client.post('/api/engine/sensitivity', { input: { ...draft(), hydrology: { kind: 'record', days } } })
    expect(res.status).toBe(422)
    expect(res.body.message).toBe('input.days[1].date: is not a calendar date')
  })

  it('sweep refuses a missing grid with 400 naming it', async () => {
    const res = await client.post('/api/engine/sweep', { input: draft() })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^grid:/)
  })

  it('sensitivity returns one bar per key input', async () => {
    const res = await client.post('/api/engine/sensitivity', { input: draft() })
    expect(res.status).toBe(200)
    expect(res.body.items.length).toBeGreaterThan(3)
    expect((await client.post('/api/engine/sensitivity', { input: draft(), fraction: 2 })).body.message).toMatch(/^fraction:/)
  })
})
