// The site list and map: which sites, filtered, sorted and paged, and what each row or marker shows.
import { z } from 'zod'
import { fromDigits } from './common'
import type { HydrologySource } from './site'

/** Columns the site list may be sorted by (allow-list). */
export const SITE_SORTS = ['name', 'riverName', 'grossHead_m', 'createdAt', 'updatedAt'] as const
export type SiteSort = (typeof SITE_SORTS)[number]

/** Query of GET /api/orgs/[orgId]/sites. `deleted=only` lists the soft-deleted sites (admins only). */
export const SiteListQuerySchema = z.object({
  page: fromDigits(z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more')).default(1),
  pageSize: fromDigits(z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more').max(200, 'must be 200 or less')).default(50),
  sort: z.enum(SITE_SORTS, { error: `must be one of ${SITE_SORTS.join(', ')}` }).default('name'),
  dir: z.enum(['asc', 'desc'], { error: "must be 'asc' or 'desc'" }).default('asc'),
  /** Text to find in the site or river name (case-insensitive). */
  q: z.string().trim().max(120, 'is too long').optional(),
  /** Exact river name (case-insensitive). */
  river: z.string().trim().max(120, 'is too long').optional(),
  deleted: z.enum(['only'], { error: "must be 'only'" }).optional(),
})
export type SiteListQuery = z.infer<typeof SiteListQuerySchema>

/** Query of GET /api/orgs/[orgId]/sites/map: the same filters, no paging. */
export const SiteMapQuerySchema = SiteListQuerySchema.pick({ q: true, river: true })

/** One row of GET /api/orgs/[orgId]/sites. */
export interface SiteListItem {
  id: number
  name: string
  riverName: string
  location: { lat: number; lng: number }
  altitude_m: number
  grossHead_m: number
  hydrologySource: HydrologySource
  /** Mean flow of the stored record, m³/s, else null. */
  recordMeanFlow: number | null
  version: number
  createdAt: string
  updatedAt: string
  deletedAt: string | null
}

export interface SiteListDto {
  page: number
  pageSize: number
  total: number
  sort: SiteSort
  dir: 'asc' | 'desc'
  sites: SiteListItem[]
}

/** One marker of GET /api/orgs/[orgId]/sites/map (every live site, no paging). */
export interface SiteMapPoint {
  id: number
  name: string
  riverName: string
  lat: number
  lng: number
  grossHead_m: number
  hydrologySource: HydrologySource
}
