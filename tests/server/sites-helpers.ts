import { expect } from 'vitest'
import type { Client } from './client'
import { addMember, signUp } from './client'

/** A valid body for POST /api/orgs/[orgId]/sites; `over` replaces top-level fields. */
export function siteBody(over: Record<string, unknown> = {}) {
  return {
    name: 'Test weir',
    riverName: 'Test Water',
    location: { lat: 54.4, lng: -2.9 },
    reach: { type: 'LineString', coordinates: [[-2.9, 54.4], [-2.899, 54.401]] },
    altitude_m: 120,
    weir: { grossHead_m: 2.1, crestWidth_m: 14, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' },
    months: Array.from({ length: 12 }, (_, i) => ({ waterTemp_C: 6 + i, upstreamOxygen: { value: 10 - i / 4, unit: 'mg/L' } })),
    fdcPoints: [
      { exceedance: 5, flow: 20 },
      { exceedance: 50, flow: 4 },
      { exceedance: 95, flow: 0.8 },
    ],
    ...over,
  }
}

export type Member = 'engineer' | 'reviewer' | 'viewer'

/** An organisation with an admin and a member of each other role, plus an outsider with an organisation of their own. */
export async function makeTeam(tag: string) {
  const owner = await signUp(`${tag}-admin`)
  const members = {} as Record<Member, Client>
  for (const role of ['engineer', 'reviewer', 'viewer'] as const) {
    const person = await signUp(`${tag}-${role}`)
    await addMember(owner.client, owner.orgId, person, role)
    members[role] = person.client
  }
  const outsider = await signUp(`${tag}-outsider`)
  return { orgId: owner.orgId, admin: owner.client, ...members, outsider: outsider.client, outsiderOrgId: outsider.orgId }
}

/** Creates a site as `client` and returns its body, failing the test on anything but 201. */
export async function createSite(client: Client, orgId: number, over: Record<string, unknown> = {}) {
  const res = await client.post(`/api/orgs/${orgId}/sites`, siteBody(over))
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body as { id: number; version: number; [k: string]: unknown }
}
