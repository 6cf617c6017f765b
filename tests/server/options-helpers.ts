import { expect } from 'vitest'
import type { Client } from './client'

/** A valid body for POST /api/sites/[id]/options; `design` entries replace the design's fields. */
export function optionBody(over: { name?: string; notes?: string; design?: Record<string, unknown>; settings?: Record<string, unknown> } = {}) {
  return {
    name: over.name ?? 'Two units',
    notes: over.notes ?? 'Test option',
    design: { units: 2, throatDiameter_m: 0.5, outletDiameter_m: 1.0, throatDepth_m: 2.5, air: { pipeDiameter_m: 0.4, pipeLength_m: 8 }, ...over.design },
    ...(over.settings ? { settings: over.settings } : {}),
  }
}

/** Creates an option as `client` and returns its body, failing the test on anything but 201. */
export async function createOption(client: Client, siteId: number, over: Parameters<typeof optionBody>[0] = {}) {
  const res = await client.post(`/api/sites/${siteId}/options`, optionBody(over))
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body as { id: number; version: number; siteId: number; [k: string]: unknown }
}

/** Stores an assessment of an option as `client`, failing the test on anything but 201. */
export async function createAssessment(client: Client, optionId: number, body: Record<string, unknown> = {}) {
  const res = await client.post(`/api/options/${optionId}/assessments`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body
}
