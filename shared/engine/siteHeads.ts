// The site's gross head at each river flow, from wherever the site takes it: the weir's hydraulics when given
// (weirHydraulics.ts: pool by the weir equation, tail by Manning or a table), else the head-vs-flow table with
// the ordinary gross head as its fallback (venturi.ts headAtFlow). One answer for the scheme and the baseline.
import type { AssessInput } from '../schemas/assess'
import { headAtFlow, type HeadPoint } from './venturi'
import { grossHeadWith, resolveWeirHydraulics, tailDepth, type WeirHydraulics } from './weirHydraulics'

type Site = AssessInput['site']

/** Where a site's heads come from, resolved once. */
export interface SiteHeads {
  /** The head table sorted by flow (unused when the hydraulics are given). */
  table: readonly HeadPoint[]
  grossHead_m: number
  hydraulics: WeirHydraulics | null
}

const resolved = new WeakMap<Site, SiteHeads>()

/** The site's heads, resolved once per site object (sorting the table, choosing the weir coefficient). */
export function siteHeads(site: Site): SiteHeads {
  let h = resolved.get(site)
  if (h) return h
  // Array sort is stable, so sorting once gives the very order headAtFlow's per-call sort gives.
  const table = [...site.headTable].sort((a, b) => a.flow_m3s - b.flow_m3s)
  const hyd = site.hydraulics ? resolveWeirHydraulics(site.hydraulics, site.crestLength_m, site.weirShape) : null
  h = { table, grossHead_m: site.grossHead_m, hydraulics: hyd }
  resolved.set(site, h)
  return h
}

/** Gross head at river flow Q, m: pool less tail by the hydraulics (never below 0), else the head table. */
export function grossHeadAt(h: SiteHeads, flow_m3s: number): number {
  const hyd = h.hydraulics
  if (hyd === null) return headAtFlow(h.table, flow_m3s, h.grossHead_m)
  const Q = Math.max(0, flow_m3s)
  return grossHeadWith(hyd, Q, tailDepth(hyd, Q))
}

/** Tail depth at river flow Q by the hydraulics, m; null without them (the head table knows no tail). */
export function tailDepthAt(h: SiteHeads, flow_m3s: number): number | null {
  return h.hydraulics === null ? null : tailDepth(h.hydraulics, Math.max(0, flow_m3s))
}
