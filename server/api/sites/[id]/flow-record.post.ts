import { flowRecordSummary, uploadFlowRecord } from '~~/server/domain/flowRecords'
import type { FlowUploadResult } from '#shared/schemas/flowRecord'
import { SiteParamsSchema } from '#shared/schemas/site'
import { FlowRecordFormSchema, MAX_FLOW_CSV_BYTES } from '#shared/schemas/flowRecord'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins upload a site's daily flow record as CSV (multipart field `file`), replacing
// the stored one or appending days to it. The whole file is checked first and every bad line is
// answered (422, data.errors[].line); nothing is stored unless all of it is accepted.
export default defineEventHandler(async (event): Promise<FlowUploadResult> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  rateLimit(event, 'uploads', user.id)
  const { file, fields } = await readUploadInMemory(event, MAX_FLOW_CSV_BYTES)
  const form = parseFields(FlowRecordFormSchema, fields)
  const { result, row } = await uploadFlowRecord(useDb(), { site, userId: user.id, file, form, now: nowIso() })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'flow-record.uploaded',
    targetType: 'site',
    targetId: id,
    detail: { fileName: file.fileName, mode: form.mode, daysInFile: result.daysInFile, gapsInFile: result.gapsInFile, days: row.day_count },
  })
  setResponseStatus(event, 201)
  return { ...result, record: flowRecordSummary(row, { id: user.id, name: user.name }) }
})
