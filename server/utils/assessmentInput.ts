import { buildAssessInput, insertAssessment, loadStoredRecord, storedOption } from '../../db/assessmentInput'
import { SiteNotReadyError } from '../../shared/utils/siteEngineInput'
import type { OptionRow, SiteRow } from '../../db/schema'
import type { AssessResult } from '../../shared/engine/assess'
import type { AssessInput } from '../../shared/schemas/assess'

/** A 422 naming the field, for a site or option the engine cannot run yet. */
export function unassessable(field: string, message: string) {
  return createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message: `${field}: ${message}`, data: { issues: [{ path: field, message }] } })
}

/**
 * The engine input for a stored option at its stored site (flow record days when the site has a
 * record, else its FDC points), defaults filled in; 422 naming the field when it cannot be assessed.
 */
export async function assessmentInputFor(site: SiteRow, option: Pick<OptionRow, 'design' | 'settings'>): Promise<AssessInput> {
  const record = await loadStoredRecord(useDb(), site.id)
  try {
    return buildAssessInput(site, record, storedOption(option))
  } catch (error) {
    if (error instanceof SiteNotReadyError) throw unassessable(error.field, error.message)
    throw error
  }
}

/** Stores one engine run as an assessment of `option` (exact input, whole result); returns the new id. */
export function storeAssessment(args: {
  option: Pick<OptionRow, 'id' | 'site_id' | 'org_id'>
  userId: number
  input: AssessInput
  result: AssessResult
  supersedesId: number | null
}): Promise<number> {
  return insertAssessment(useDb(), args)
}
