import type { Catchment, FlowUploadErrorData, FlowUploadResult } from '../../../../shared/schemas/site'
import {
  FLOW_CSV_EXTENSIONS,
  FLOW_CSV_TYPES,
  FlowRecordFormSchema,
  MAX_FLOW_CSV_BYTES,
  MAX_FLOW_DAYS,
  SiteParamsSchema,
} from '../../../../shared/schemas/site'
import { EDITOR_ROLES } from '../../../../shared/utils/roles'

const unprocessable = (message: string, data: FlowUploadErrorData) =>
  createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message, data })

// Engineers and admins upload a site's daily flow record as CSV (multipart field `file`), replacing
// the stored one or appending days to it. The whole file is checked first and every bad line is
// answered (422, data.errors[].line); nothing is stored unless all of it is accepted.
export default defineEventHandler(async (event): Promise<FlowUploadResult> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  rateLimit(event, 'uploads', user.id)
  const { file, fields } = await readUploadInMemory(event, MAX_FLOW_CSV_BYTES)
  const { fileName, mediaType } = file
  const form = parseFields(FlowRecordFormSchema, fields)

  const extensionOk = FLOW_CSV_EXTENSIONS.some((ext) => fileName.toLowerCase().endsWith(ext))
  if (!(FLOW_CSV_TYPES as readonly string[]).includes(mediaType) && !extensionOk) {
    throw createError({
      statusCode: 415,
      statusMessage: 'Unsupported Media Type',
      message: `file: must be a CSV or text file (.csv or .txt, ${FLOW_CSV_TYPES.join(', ')}); got ${mediaType || 'no type'} "${fileName}"`,
    })
  }
  const text = decodeCsvBytes(file.data)
  if (text === null) throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: `file: "${fileName}" is not a text file` })

  const db = useDb()
  const stored = form.mode === 'append' ? await db.selectFrom('flow_records').selectAll().where('site_id', '=', id).executeTakeFirst() : undefined
  const storedDays = stored ? (await db.selectFrom('flow_days').select(['day as date', 'flow']).where('site_id', '=', id).orderBy('day').execute()) : []

  // Scaling: append keeps the stored record's; otherwise the form's areas, else the site's catchment.
  const formScale = form.siteAreaKm2 !== undefined && form.gaugeAreaKm2 !== undefined ? { siteAreaKm2: form.siteAreaKm2, gaugeAreaKm2: form.gaugeAreaKm2 } : null
  if (form.scale === 'none' && formScale) {
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: "scale: 'none' cannot be combined with catchment areas" })
  }
  let scale: { siteAreaKm2: number; gaugeAreaKm2: number } | null
  if (stored) {
    scale = recordScale(stored)
    const same = formScale === null || (scale !== null && scale.siteAreaKm2 === formScale.siteAreaKm2 && scale.gaugeAreaKm2 === formScale.gaugeAreaKm2)
    if (!same || (form.scale === 'none' && scale !== null)) {
      throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'siteAreaKm2: appended days take the stored record\'s scaling; replace the record to change it' })
    }
  } else if (form.scale === 'none') scale = null
  else scale = formScale ?? (site.catchment ? (JSON.parse(site.catchment) as Catchment) : null)

  const parsed = parseFlowCsv(text, {
    dateColumn: form.dateColumn,
    flowColumn: form.flowColumn,
    dateFormat: form.dateFormat,
    existingDays: stored ? new Set(storedDays.map((d) => d.date)) : undefined,
    maxDays: MAX_FLOW_DAYS - storedDays.length,
  })
  if (!parsed.ok) {
    if (parsed.kind === 'columns') throw unprocessable(parsed.message, { errors: [], needsColumns: true, header: parsed.header })
    throw unprocessable(parsed.message, { errors: parsed.errors, errorCount: parsed.errorCount })
  }
  if (!parsed.days.some((d) => d.flow !== null) && !storedDays.some((d) => d.flow !== null)) {
    throw unprocessable('file: has no day with a flow; every line is a gap', { errors: [] })
  }
  const mode = stored ? 'append' : 'replace'
  const row = await saveFlowRecord(db, id, mode, parsed.days, storedDays, {
    fileName,
    uploadedBy: user.id,
    dateColumn: parsed.dateColumn,
    flowColumn: parsed.flowColumn,
    flagColumn: parsed.flagColumn,
    dateFormat: parsed.dateFormat,
    scale,
  })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'flow-record.uploaded',
    targetType: 'site',
    targetId: id,
    detail: { fileName, mode: form.mode, daysInFile: parsed.days.length, gapsInFile: parsed.gaps, days: row.day_count },
  })
  setResponseStatus(event, 201)
  return {
    mode: form.mode,
    daysInFile: parsed.days.length,
    gapsInFile: parsed.gaps,
    flaggedInFile: parsed.flagged,
    record: flowRecordSummary(row, { id: user.id, name: user.name }),
  }
})
