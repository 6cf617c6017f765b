import { commissioningBasis, commissioningRecordDto, storeCommissioningRecord } from '~~/server/domain/commissioning'
import { CommissioningInputSchema, type CommissioningRecordDto } from '#shared/schemas/commissioning'
import { SiteParamsSchema } from '#shared/schemas/site'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins store a commissioning record: a measurement on the built scheme checked
// against one of the site's assessments. The engine works out the measured flow and oxygen transfer
// and the assessment's own figures at the measured conditions (one flow, in the worker pool); the
// record keeps them with the engine's version. Within the person's assessment allowance.
export default defineEventHandler(async (event): Promise<CommissioningRecordDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  rateLimit(event, 'engine-assess', user.id)
  const body = await readValidatedJson(event, CommissioningInputSchema, BODY_LIMITS.form)
  const db = useDb()
  const { optionId, input } = await commissioningBasis(db, site.id, body.assessmentId)
  assertEngineRoom(event)
  const { engineVersion, ...result } = await runEngine(event, { kind: 'commissioning-check', input, measurement: body })
  const newId = await storeCommissioningRecord(db, { siteId: site.id, orgId: site.org_id, optionId, userId: user.id, input: body, result, engineVersion })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'commissioning.recorded',
    targetType: 'commissioning',
    targetId: newId,
    detail: { siteId: site.id, assessmentId: body.assessmentId, measuredAt: body.measuredAt, flow: result.flowVerdict.kind, oxygen: result.oxygenVerdict.kind, engineVersion },
  })
  setResponseStatus(event, 201)
  return (await commissioningRecordDto(db, site.id, newId))!
})
