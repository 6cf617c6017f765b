import { CompareQuerySchema, type CompareDto, type OptionDesign, type OptionSettings } from '../../shared/schemas/option'

// 2 to 6 options side by side, from any sites of any organisations the user belongs to (any role):
// each option's design and settings, its site and its latest assessment. 404 naming the first option
// that is missing, deleted or not visible (ids do not leak across organisations).
export default defineEventHandler(async (event): Promise<CompareDto> => {
  const user = await requireUser(event)
  const { options: ids } = await getValidatedQuery(event, validator(CompareQuerySchema, 'query'))
  const rows = await useDb()
    .selectFrom('options')
    .innerJoin('sites', 'sites.id', 'options.site_id')
    .innerJoin('memberships', (j) => j.onRef('memberships.org_id', '=', 'sites.org_id').on('memberships.user_id', '=', user.id))
    .select([
      'options.id',
      'options.name',
      'options.design',
      'options.settings',
      'options.version',
      'sites.id as site_id',
      'sites.org_id',
      'sites.name as site_name',
      'sites.river_name',
      'sites.gross_head_m',
    ])
    .where('options.id', 'in', ids)
    .where('options.deleted_at', 'is', null)
    .where('sites.deleted_at', 'is', null)
    .execute()
  const byId = new Map(rows.map((r) => [r.id, r]))
  const missing = ids.find((id) => !byId.has(id))
  if (missing !== undefined) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: `options: option ${missing} not found` })
  const latest = await latestAssessments(ids)
  return {
    items: ids.map((id) => {
      const r = byId.get(id)!
      return {
        option: { id: r.id, name: r.name, design: JSON.parse(r.design) as OptionDesign, settings: JSON.parse(r.settings) as OptionSettings, version: r.version },
        site: { id: r.site_id, orgId: r.org_id, name: r.site_name, riverName: r.river_name, grossHeadM: r.gross_head_m },
        latestAssessment: latest.get(id) ?? null,
      }
    }),
  }
})
