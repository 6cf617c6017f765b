import { AssessInputSchema, type AssessInput } from '../../../../../shared/schemas/assess'
import { AssessmentCreateSchema, OptionParamsSchema } from '../../../../../shared/schemas/option'
import { EDITOR_ROLES } from '../../../../../shared/utils/roles'

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

  let input: AssessInput | undefined
  let supersedesId: number | null = null
  if (body.rerunOf !== undefined) {
    const old = await db
      .selectFrom('assessments')
      .innerJoin('assessment_payloads', 'assessment_payloads.assessment_id', 'assessments.id')
      .select(['assessments.id', 'assessments.option_id', 'assessment_payloads.input_json'])
      .where('assessments.id', '=', body.rerunOf)
      .executeTakeFirst()
    if (!old || old.option_id !== option.id) throw unassessable('rerunOf', `assessment ${body.rerunOf} is not an assessment of this option`)
    const later = await db.selectFrom('assessments').select('id').where('supersedes_id', '=', old.id).executeTakeFirst()
    if (later) throw alreadyRerun(old.id, later.id)
    supersedesId = old.id
    if (body.use === 'stored') {
      const stored = AssessInputSchema.safeParse(JSON.parse(old.input_json))
      if (!stored.success) {
        const issue = stored.error.issues[0]!
        throw unassessable('rerunOf', `the stored input no longer fits this engine (${issue.path.map(String).join('.')}: ${issue.message}); re-run with use 'current'`)
      }
      input = stored.data
    }
  }
  assertEngineRoom(event)
  input ??= await assessmentInputFor(site, option)
  const engineInput = input
  const result = await runEngine(event, { kind: 'assess-input', input: engineInput })

  let newId: number
  try {
    newId = await storeAssessment({ option, userId: user.id, input: engineInput, result, supersedesId })
  } catch (error) {
    // Two re-runs of the same assessment at once: the unique index lets one through.
    if (supersedesId !== null && /UNIQUE constraint failed: assessments\.supersedes_id/.test(String(error))) {
      const later = await db.selectFrom('assessments').select('id').where('supersedes_id', '=', supersedesId).executeTakeFirst()
      throw alreadyRerun(supersedesId, later?.id ?? 0)
    }
    throw error
  }
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'assessment.created',
    targetType: 'assessment',
    targetId: newId,
    detail: { siteId: site.id, optionId: option.id, engineVersion: result.engineVersion, supersedes: supersedesId, use: body.rerunOf !== undefined ? body.use : 'current' },
  })
  setResponseStatus(event, 201)
  return (await loadAssessmentDetail(newId))!
})

function alreadyRerun(oldId: number, laterId: number) {
  return createError({
    statusCode: 409,
    statusMessage: 'Conflict',
    message: `rerunOf: assessment ${oldId} was already re-run as assessment ${laterId}; re-run that one instead`,
    data: { supersededBy: laterId },
  })
}
