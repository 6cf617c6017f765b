// The review of a site: typed fetch wrappers over server/api/sites/[id]/review/** (how it is shown is
// in utils/review.ts). Shapes come from shared/schemas/review.ts, written once.
import type { OptionListDto } from '#shared/schemas/option'
import type { AssessmentListDto } from '#shared/schemas/assessment'
import type { ReviewBriefDto, ReviewChangeDto, ReviewDecisionInput, ReviewDto, ReviewSubmitInput } from '#shared/schemas/review'
import { assessmentChoices } from '../utils/review'

/** The review of a site: state, assessment under review, decision, history and what the caller may do. */
export function useReview(siteId: Ref<number>) {
  return useFetch<ReviewDto>(() => `/api/sites/${siteId.value}/review`, { key: computed(() => `review-${siteId.value}`) })
}

/** What the reviewer judges, read from the stored result of the assessment under review. */
export function useReviewBrief(siteId: Ref<number>) {
  return useFetch<ReviewBriefDto>(() => `/api/sites/${siteId.value}/review/brief`, { key: computed(() => `review-brief-${siteId.value}`) })
}

/** Every stored assessment of every live option of the site (for the submit form). */
export function useSiteAssessmentChoices(siteId: Ref<number>) {
  const request = useRequestFetch()
  return useAsyncData(
    () => `review-choices-${siteId.value}`,
    async () => {
      const { options } = await request<OptionListDto>(`/api/sites/${siteId.value}/options`)
      const lists = await Promise.all(options.map((o) => request<AssessmentListDto>(`/api/options/${o.id}/assessments`, { query: { pageSize: 50 } })))
      return assessmentChoices(options.map((o) => ({ id: o.id, name: o.name })), lists)
    },
    { watch: [siteId] },
  )
}

/** Submits (or re-submits) the site for review with one of its assessments. */
export function submitReview(siteId: number, body: ReviewSubmitInput): Promise<ReviewChangeDto> {
  return $fetch<ReviewChangeDto>(`/api/sites/${siteId}/review/submit`, { method: 'POST', body })
}

/** Records a reviewer's decision on the submitted site. */
export function decideReview(siteId: number, body: ReviewDecisionInput): Promise<ReviewChangeDto> {
  return $fetch<ReviewChangeDto>(`/api/sites/${siteId}/review/decision`, { method: 'POST', body })
}
