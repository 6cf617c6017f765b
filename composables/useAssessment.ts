// Stored assessments: typed fetch wrappers over the assessment routes. How a result is shown lives in
// utils/assessment.ts and utils/assessmentCharts.ts.
import type { SensitivityResult } from '#shared/engine/sensitivity'
import type { AssessInput } from '#shared/schemas/assess'
import type { AssessmentCreate, AssessmentDetailDto, AssessmentListDto, AssessmentTable } from '#shared/schemas/assessment'

/** One stored assessment with its exact input and whole result. */
export function useAssessmentDetail(id: Ref<number>) {
  return useFetch<AssessmentDetailDto>(() => `/api/assessments/${id.value}`, { key: computed(() => `assessment-${id.value}`) })
}

/** An option's stored assessments, newest first. */
export function useOptionAssessments(optionId: Ref<number>) {
  return useFetch<AssessmentListDto>(() => `/api/options/${optionId.value}/assessments`, { key: computed(() => `assessments-of-${optionId.value}`) })
}

/** Runs the engine on the server for the option as stored and stores the run; `rerunOf` keeps the older one. */
export function runAssessment(optionId: number, body: Partial<AssessmentCreate> = {}): Promise<AssessmentDetailDto> {
  return $fetch<AssessmentDetailDto>(`/api/options/${optionId}/assessments`, { method: 'POST', body })
}

/** ±fraction on each key input of a stored input (stateless engine route). */
export function fetchSensitivity(input: AssessInput, fraction = 0.2): Promise<SensitivityResult> {
  return $fetch<SensitivityResult>('/api/engine/sensitivity', { method: 'POST', body: { input, fraction } })
}

/** Download address of one table of a stored assessment as CSV. */
export function exportUrl(id: number, table: AssessmentTable): string {
  return `/api/assessments/${id}/export/${table}.csv`
}
