// The portfolio query: an organisation's live sites with the headline figures of each site's latest
// assessment (of a live option), in ONE SQL statement (no query per site). The total comes from a
// window count, so paging needs no second query.
// scripts/bench/portfolio.ts times this very query.
import { sql, type Kysely } from 'kysely'
import Papa from 'papaparse'
import type { Database } from '../../db/schema'
import type { FlagId } from '../../shared/engine/results'
import { ENGINE_VERSION } from '../../shared/engine/version'
import { PORTFOLIO_MAP_MAX, type PortfolioDto, type PortfolioQuery, type PortfolioRow, type PortfolioSort } from '../../shared/schemas/portfolio'
import { REVIEW_STATES, type ReviewState } from '../../shared/schemas/review'
import type { Currency } from '../../shared/schemas/organisation'
import { organisationCurrency } from './organisations'
import { siteTextFilter } from './sites'

// Sort keys as the `page` step sees them: site columns from `latest`, figures from the assessment.
const SORT_COLUMNS = {
  name: 'l.name',
  riverName: 'l.river_name',
  grossHead_m: 'l.gross_head_m',
  assessedAt: 'a.id',
  annualEnergy_MWh: 'a.annual_energy_mwh',
  capacityFactor: 'a.capacity_factor',
  ratedPower_kW: 'a.rated_power_kw',
  minCavitationMargin_m: 'a.min_cavitation_margin_m',
  netOxygenGainSummerLowFlow_mgL: 'a.net_oxygen_gain_slf_mgl',
  lcoe: 'a.lcoe',
  npv: 'a.npv',
  capex: 'a.capex',
  energyP90_MWh: 'a.energy_p90_mwh',
  baselineEnergy_MWh: 'a.baseline_energy_mwh',
  flagsRaised: 'a.flag_count',
  reviewState: 'l.review_rank',
} as const satisfies Record<PortfolioSort, string>

/** The review state of `sites` (no site_reviews row: `draft`), and its place in REVIEW_STATES (sort order). */
const reviewStateSql = sql<ReviewState>`coalesce(${sql.ref('r.state')}, 'draft')`
const reviewRankSql = sql<number>`case ${reviewStateSql} ${sql.join(REVIEW_STATES.map((s, i) => sql`when ${s} then ${i}`), sql` `)} end`

/**
 * The portfolio statement for one organisation; `paged: false` returns every matching row (CSV).
 * Three steps: `latest` reads each live site once from the covering sites_portfolio index, with its
 * latest assessment of a live option found backwards on the covering (site_id, id, option_id) index
 * (the organisation's live option ids are listed once from options_live); `page` sorts those by the
 * chosen key, counts them (window) and cuts the page; only the page's rows then fetch the figures and
 * the option name.
 */
export function portfolioQuery(db: Kysely<Database>, orgId: number, query: Omit<PortfolioQuery, 'format'>, paged = true) {
  const dir = query.dir === 'desc' ? sql`desc` : sql`asc`
  return db
    .with(
      (cte) => cte('latest').materialized(),
      (d) => {
        let sites = d
          .selectFrom('sites')
          .leftJoin('site_reviews as r', (j) => j.onRef('r.site_id', '=', 'sites.id').on('r.org_id', '=', orgId))
          .select((eb) => [
            reviewStateSql.as('review_state'),
            reviewRankSql.as('review_rank'),
            'sites.id as site_id',
            'sites.name',
            'sites.river_name',
            'sites.lat',
            'sites.lng',
            'sites.gross_head_m',
            eb
              .selectFrom('assessments')
              .select('assessments.id')
              .whereRef('assessments.site_id', '=', 'sites.id')
              .where('assessments.option_id', 'in', (w) => w.selectFrom('options').select('options.id').where('options.org_id', '=', orgId).where('options.deleted_at', 'is', null))
              .orderBy('assessments.id', 'desc')
              .limit(1)
              .as('latest_id'),
          ])
          .where('sites.org_id', '=', orgId)
          .where('sites.deleted_at', 'is', null)
        if (query.q) {
          const text = query.q
          sites = sites.where((eb) => siteTextFilter(eb, text))
        }
        if (query.river) sites = sites.where('sites.river_name', '=', query.river)
        if (query.reviewState) sites = sites.where(reviewStateSql, '=', query.reviewState)
        return sites
      },
    )
    .with('page', (d) => {
      let page = d
        .selectFrom('latest as l')
        .leftJoin('assessments as a', 'a.id', 'l.latest_id')
        .select([
          'l.site_id',
          'l.name',
          'l.river_name',
          'l.lat',
          'l.lng',
          'l.gross_head_m',
          'l.latest_id',
          'l.review_state',
          sql<string | number | null>`${sql.ref(SORT_COLUMNS[query.sort])}`.as('sort_key'),
          sql<number>`count(*) over ()`.as('total'),
        ])
      if (query.assessed === 'yes') page = page.where('l.latest_id', 'is not', null)
      if (query.assessed === 'no') page = page.where('l.latest_id', 'is', null)
      page = page.orderBy(sql`${sql.ref(SORT_COLUMNS[query.sort])} ${dir} nulls last`).orderBy(sql`${sql.ref('l.site_id')} ${dir}`)
      return paged ? page.limit(query.pageSize).offset((query.page - 1) * query.pageSize) : page
    })
    .selectFrom('page as p')
    .leftJoin('assessments as a', 'a.id', 'p.latest_id')
    .leftJoin('options as o', 'o.id', 'a.option_id')
    .select([
      'p.site_id',
      'p.name',
      'p.river_name',
      'p.lat',
      'p.lng',
      'p.gross_head_m',
      'p.total',
      'p.review_state',
      'a.id as assessment_id',
      'a.option_id',
      'o.name as option_name',
      'a.created_at as assessed_at',
      'a.engine_version',
      'a.annual_energy_mwh',
      'a.capacity_factor',
      'a.rated_power_kw',
      'a.min_cavitation_margin_m',
      'a.net_oxygen_gain_slf_mgl',
      'a.lcoe',
      'a.npv',
      'a.capex',
      'a.energy_p50_mwh',
      'a.energy_p90_mwh',
      'a.net_loss_probability',
      'a.record_p90_mwh',
      'a.baseline_energy_mwh',
      'a.flags_raised',
    ])
    .orderBy(sql`${sql.ref('p.sort_key')} ${dir} nulls last`)
    .orderBy(sql`${sql.ref('p.site_id')} ${dir}`)
}

/** What one row of the statement holds. */
export type PortfolioSqlRow = Awaited<ReturnType<ReturnType<typeof portfolioQuery>['execute']>>[number]

/** Number of live sites matching the filters (only needed when a page lies past the end). */
export async function portfolioCount(db: Kysely<Database>, orgId: number, query: Omit<PortfolioQuery, 'format'>): Promise<number> {
  const first = await portfolioQuery(db, orgId, { ...query, page: 1, pageSize: 1 }).executeTakeFirst()
  return first ? Number(first.total) : 0
}

/** A statement row as the API shows it. */
export function portfolioRow(r: PortfolioSqlRow): PortfolioRow {
  return {
    siteId: r.site_id,
    name: r.name,
    riverName: r.river_name,
    location: { lat: r.lat, lng: r.lng },
    grossHead_m: r.gross_head_m,
    reviewState: r.review_state,
    latest:
      r.assessment_id === null
        ? null
        : {
            assessmentId: r.assessment_id,
            optionId: r.option_id!,
            optionName: r.option_name ?? '',
            assessedAt: r.assessed_at!,
            engineVersion: r.engine_version!,
            stale: r.engine_version !== ENGINE_VERSION,
            annualEnergy_MWh: r.annual_energy_mwh!,
            capacityFactor: r.capacity_factor!,
            ratedPower_kW: r.rated_power_kw!,
            minCavitationMargin_m: r.min_cavitation_margin_m,
            netOxygenGainSummerLowFlow_mgL: r.net_oxygen_gain_slf_mgl!,
            lcoe: r.lcoe,
            npv: r.npv,
            capex: r.capex,
            energyP50_MWh: r.energy_p50_mwh,
            energyP90_MWh: r.energy_p90_mwh,
            netLossProbability: r.net_loss_probability,
            recordP90_MWh: r.record_p90_mwh,
            baselineEnergy_MWh: r.baseline_energy_mwh,
            flagsRaised: JSON.parse(r.flags_raised ?? '[]') as FlagId[],
          },
  }
}

/** Text a spreadsheet will not run as a formula (a leading = + - @ gets a quote mark). */
const safeText = (s: string) => (/^[=+\-@\t\r]/.test(s) ? `'${s}` : s)

/** The portfolio rows as CSV, units in the header (amounts in the organisation's currency, by its ISO code), every line (the last too) ended by CRLF. */
export function portfolioCsv(rows: readonly PortfolioRow[], currency: Currency): string {
  const c = currency.code
  return `${Papa.unparse({
    fields: [
      'Site id', 'Site', 'River', 'Latitude (°)', 'Longitude (°)', 'Gross head (m)', 'Option', 'Assessed at (UTC)', 'Engine version', 'Stale (-)',
      'Annual energy (MWh/yr)', 'Annual energy of a conventional turbine at the same weir (MWh/yr)', 'Capacity factor (-)', 'Rated power (kW)', 'Net oxygen gain at summer low flow (mg/L)',
      `Levelised cost (${c}/MWh)`, `Net present value (${c})`, `Capital cost (${c})`,
      'P90 annual energy of the Monte Carlo (MWh/yr)', 'Chance of a net oxygen loss in the worst month (-)', 'Minimum cavitation margin (m)', 'Flags raised (-)', 'Review state',
    ],
    data: rows.map((r) => {
      const l = r.latest
      return [
        r.siteId, safeText(r.name), safeText(r.riverName), r.location.lat, r.location.lng, r.grossHead_m,
        l ? safeText(l.optionName) : '', l?.assessedAt ?? '', l?.engineVersion ?? '', l ? (l.stale ? 'yes' : 'no') : '',
        l?.annualEnergy_MWh ?? '', l?.baselineEnergy_MWh ?? '', l?.capacityFactor ?? '', l?.ratedPower_kW ?? '', l?.netOxygenGainSummerLowFlow_mgL ?? '',
        l?.lcoe ?? '', l?.npv ?? '', l?.capex ?? '',
        l?.energyP90_MWh ?? '', l?.netLossProbability ?? '', l?.minCavitationMargin_m ?? '', l ? l.flagsRaised.join(' ') : '', r.reviewState,
      ]
    }),
  })}\r\n`
}

/** Every matching row of the portfolio, unpaged (the CSV download). */
export async function allPortfolioRows(db: Kysely<Database>, orgId: number, query: Omit<PortfolioQuery, 'format'>): Promise<PortfolioRow[]> {
  return (await portfolioQuery(db, orgId, query, false).execute()).map(portfolioRow)
}

/** The portfolio as the API answers it: one page (`page`), or every matching row up to PORTFOLIO_MAP_MAX unpaged (`map`). */
export async function loadPortfolio(db: Kysely<Database>, orgId: number, query: Omit<PortfolioQuery, 'format'>, shape: 'page' | 'map'): Promise<PortfolioDto> {
  const currency = await organisationCurrency(db, orgId)
  if (shape === 'map') {
    const rows = await portfolioQuery(db, orgId, { ...query, page: 1, pageSize: PORTFOLIO_MAP_MAX }).execute()
    const total = rows.length > 0 ? Number(rows[0]!.total) : 0
    return { page: 1, pageSize: PORTFOLIO_MAP_MAX, total, sort: query.sort, dir: query.dir, currency, rows: rows.map(portfolioRow) }
  }
  const rows = await portfolioQuery(db, orgId, query).execute()
  const total = rows.length > 0 ? Number(rows[0]!.total) : query.page > 1 ? await portfolioCount(db, orgId, query) : 0
  return { page: query.page, pageSize: query.pageSize, total, sort: query.sort, dir: query.dir, currency, rows: rows.map(portfolioRow) }
}
