// The side-by-side comparison of 2–6 options (GET /api/compare).
import type { Ref } from 'vue'
import type { CompareDto } from '#shared/schemas/compare'

/** The comparison of 2–6 options, in the order asked; null while fewer than 2 are picked. */
export function useCompare(ids: Ref<number[]>) {
  const fetcher = useRequestFetch()
  return useAsyncData(
    () => `compare-${ids.value.join(',')}`,
    () => (ids.value.length >= 2 ? fetcher<CompareDto>('/api/compare', { query: { options: ids.value.join(',') } }) : Promise.resolve(null)),
    { watch: [ids] },
  )
}
