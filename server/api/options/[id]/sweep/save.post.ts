import { assessmentInputFor } from '~~/server/domain/assessments'
import { unprocessable } from '~~/server/domain/errors'
import { createOption, optionDto } from '~~/server/domain/options'
import { EngineOptionSchema, OptionParamsSchema, SweepSaveSchema } from '#shared/schemas/option'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins save one point of a sweep as a new option at the same site: the option's design
// with that throat diameter (outlet scaled to keep the area ratio, as the sweep does), units and
// submergence; its settings and costs carried over. Answers 201 with the new option. The design is
// moved by the engine in the worker pool.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(OptionParamsSchema, 'params'))
  const { user, site, option } = await requireOption(event, id, EDITOR_ROLES)
  const body = await readValidatedJson(event, SweepSaveSchema, BODY_LIMITS.form)
  assertEngineRoom(event)
  const input = await assessmentInputFor(useDb(), site, option)
  const moved = await runEngine(event, { kind: 'design-at', input, throatDiameter_m: body.throatDiameter_m, units: body.units, throatDepth_m: body.throatDepth_m })
  const checked = EngineOptionSchema.safeParse(moved)
  if (!checked.success) {
    const issue = checked.error.issues[0]!
    const field = issue.path.map(String).join('.')
    throw unprocessable(field === 'throatDiameter_m' || field === 'units' || field === 'throatDepth_m' ? field : 'throatDiameter_m', `the point gives a design the engine refuses (${field}: ${issue.message})`)
  }
  const row = await createOption(useDb(), {
    site,
    userId: user.id,
    name: body.name,
    notes: `Saved from a sweep of "${option.name}": throat ${body.throatDiameter_m} m, ${body.units} unit(s), throat depth ${body.throatDepth_m} m.`,
    design: JSON.stringify(checked.data),
    settings: option.settings,
  })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'option.created',
    targetType: 'option',
    targetId: row.id,
    detail: { siteId: site.id, name: row.name, fromSweepOf: option.id, throatDiameter_m: body.throatDiameter_m, units: body.units, throatDepth_m: body.throatDepth_m },
  })
  setResponseStatus(event, 201)
  return optionDto(row, user.name, null)
})
