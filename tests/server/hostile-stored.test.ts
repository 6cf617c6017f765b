import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { OptionInputSchema, OptionPatchSchema, OptionSweepSchema, SweepSaveSchema } from '../../shared/schemas/option'
import { AssessmentCreateSchema } from '../../shared/schemas/assessment'
import { SiteInputSchema, SitePatchSchema } from '../../shared/schemas/site'
import { bodiesFor, expectFieldRefusal, expectSafe, hostileValue, orgRows, refusedBodies, show } from './hostile-arbitraries'
import { createAssessment, createOption, optionBody } from './options-helpers'
import { createSite, makeTeam, siteBody } from './sites-helpers'

// Hostile bodies on the routes that write sites, options and assessments (site create and patch,
// option create and patch, assessment run, sweep and sweep save): each body the route's schema
// refuses is a 400 naming its field, and every stored row of the organisation is as it was.
// (sites.test.ts and options.test.ts throw any JSON at the same routes; this checks the rows.)

let team: Awaited<ReturnType<typeof makeTeam>>
let siteId: number
let optionId: number

const TABLES = ['sites', 'options', 'assessments', 'audit_log']

beforeAll(async () => {
  team = await makeTeam('hostile-st')
  siteId = (await createSite(team.engineer, team.orgId, { name: 'Hostile stored weir' })).id
  optionId = (await createOption(team.engineer, siteId)).id
  await createAssessment(team.engineer, optionId)
})

/** A good body with one nested field (at any depth) replaced by anything. */
function nestedMutations(good: Record<string, unknown>): fc.Arbitrary<unknown> {
  const paths: string[][] = []
  const walk = (v: unknown, at: string[]) => {
    if (at.length) paths.push(at)
    if (v !== null && typeof v === 'object') for (const [k, x] of Object.entries(v)) if (!(Array.isArray(v) && Number(k) > 1)) walk(x, [...at, k])
  }
  walk(good, [])
  return fc.tuple(fc.constantFrom(...paths), hostileValue).map(([path, value]) => {
    const copy = structuredClone(good)
    let at = copy as Record<string, unknown>
    for (const k of path.slice(0, -1)) at = at[k] as Record<string, unknown>
    at[path.at(-1)!] = value
    return copy
  })
}

describe('hostile bodies on the site, option and assessment routes', () => {
  it('are refused with a 400 naming the field, and change no stored row', async () => {
    const before = orgRows(team.orgId, TABLES)
    const site = siteBody()
    const option = optionBody()
    const routes = [
      { method: 'POST', path: `/api/orgs/${team.orgId}/sites`, schema: SiteInputSchema, good: site },
      { method: 'PATCH', path: `/api/sites/${siteId}`, schema: SitePatchSchema, good: { ...site, version: 1 } },
      { method: 'POST', path: `/api/sites/${siteId}/options`, schema: OptionInputSchema, good: option },
      { method: 'PATCH', path: `/api/options/${optionId}`, schema: OptionPatchSchema, good: { ...option, version: 1 } },
      { method: 'POST', path: `/api/options/${optionId}/assessments`, schema: AssessmentCreateSchema, good: { use: 'stored', rerunOf: 1 } },
      { method: 'POST', path: `/api/options/${optionId}/sweep`, schema: OptionSweepSchema, good: { grid: { throatDiameters_m: [0.4], units: [1], throatDepths_m: [1] } } },
      { method: 'POST', path: `/api/options/${optionId}/sweep/save`, schema: SweepSaveSchema, good: { throatDiameter_m: 0.4, units: 1, throatDepth_m: 1, name: 'Saved' } },
    ]
    for (const route of routes) {
      await fc.assert(
        fc.asyncProperty(refusedBodies(route.schema, fc.oneof(bodiesFor(route.good), nestedMutations(route.good))), async (body) => {
          expectFieldRefusal(await team.engineer.request(route.method, route.path, JSON.stringify(body)), `${route.method} ${route.path} ${show(body)}`, body)
        }),
        { numRuns: 50 },
      )
    }
    expect(orgRows(team.orgId, TABLES)).toEqual(before)
  })

  it('a patch the schema takes but with a stale version is a 409 and changes nothing', async () => {
    const before = orgRows(team.orgId, TABLES)
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 2, max: 2 ** 31 }), fc.constantFrom('site', 'option'), async (version, what) => {
        const res = what === 'site'
          ? await team.engineer.patch(`/api/sites/${siteId}`, { name: 'Changed', version })
          : await team.engineer.patch(`/api/options/${optionId}`, { name: 'Changed', version })
        expectSafe(res, `${what} v${version}`)
        expect(res.status).toBe(409)
      }),
      { numRuns: 20 },
    )
    expect(orgRows(team.orgId, TABLES)).toEqual(before)
  })
})
