import { assessmentInputFor, rerunBasis, storeAssessment } from '~~/server/domain/assessments'
import { loadAssessmentDetail } from '~~/server/domain/options'
import { OptionParamsSchema } from '#shared/schemas/option'
import { AssessmentCreateSchema } from '#shared/schemas/assessment'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins run the engine on the server for an option at its site and store the run: the
// exact input (defaults filled in), the engine version, the headline figures and the whole result.
// `rerunOf` links the new run to an older one of this option, which is kept; `use: 'stored'` re-runs
// the older run's stored input exactly, else the input is built afresh from the site and option.
// Within the person's assessment allowance (shared with POST /api/engine/assess); the engine runs in
// the worker pool.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(OptionParamsSchema, 'params'))
  const { user, site, option } = await requireOption(event, id, EDITOR_ROLES)
  rateLimit(event, 'engine-assess', user.id)
  const body = await readValidatedJson(event, AssessmentCreateSchema, BODY_LIMITS.form)
  const db = useDb()
  const rerun = await rerunBasis(db, option, body)
  assertEngineRoom(event)
  const input = rerun.input ?? (await assessmentInputFor(db, site, option))
  const result = await runEngine(event, { kind: 'assess-input', input })
  const newId = await storeAssessment(db, { option, userId: user.id, input, result, supersedesId: rerun.supersedesId })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'assessment.created',
    targetType: 'assessment',
    targetId: newId,
    detail: { siteId: site.id, optionId: option.id, engineVersion: result.engineVersion, supersedes: rerun.supersedesId, use: body.rerunOf !== undefined ? body.use : 'current' },
  })
  setResponseStatus(event, 201)
  return (await loadAssessmentDetail(db, newId))!
})
