// A site's commissioning records (server/api/sites/[id]/commissioning, server/api/commissioning).
import type { CommissioningInput, CommissioningListDto, CommissioningRecordDto } from '#shared/schemas/commissioning'

/** The site's records, newest measurement first, and the assessments a new one may check. */
export function useCommissioning(siteId: Ref<number>) {
  return useFetch<CommissioningListDto>(() => `/api/sites/${siteId.value}/commissioning`, {
    key: computed(() => `commissioning-${siteId.value}`),
  })
}

/** Stores a record; the server checks it against the assessment and answers it with its verdicts. */
export function createCommissioningRecord(siteId: number, body: CommissioningInput): Promise<CommissioningRecordDto> {
  return $fetch<CommissioningRecordDto>(`/api/sites/${siteId}/commissioning`, { method: 'POST', body })
}

/** Removes one record (it stays in the database, marked deleted). */
export function deleteCommissioningRecord(id: number): Promise<{ id: number; deleted: boolean }> {
  return $fetch<{ id: number; deleted: boolean }>(`/api/commissioning/${id}`, { method: 'DELETE' })
}
