// Typed wrappers over a site's hydrology routes: the curve in use and its statistics, the stored
// daily flow record, and the CSV upload (with progress, see useUpload).
import type { DateFormat, FlowRecordDto, FlowUploadResult, HydrologyDto } from '#shared/schemas/flowRecord'
import { type FlowUploadOutcome, uploadOutcomeFromError } from '../utils/flowUpload'
import { useUpload } from './useUpload'

/** The FDC in use for the site, its Q95/Q50/Q10/mean, monthly statistics and reserved flow. */
export function useHydrology(siteId: Ref<number>) {
  return useFetch<HydrologyDto>(() => `/api/sites/${siteId.value}/hydrology`, { key: computed(() => `hydrology-${siteId.value}`) })
}

/**
 * The stored daily record (up to 80,000 days): fetched in the browser only, so the page's server
 * render stays small. `stamp` names the stored record (null for none); a new stamp refetches.
 */
export function useFlowRecord(siteId: Ref<number>, stamp: Ref<string | null>) {
  const result = useFetch<FlowRecordDto>(() => `/api/sites/${siteId.value}/flow-record`, {
    key: computed(() => `flow-record-${siteId.value}`),
    server: false,
    immediate: false,
    watch: false,
  })
  watch(
    [siteId, stamp],
    ([, on]) => {
      if (!import.meta.client) return
      if (on) void result.execute()
      else result.data.value = undefined
    },
    { immediate: true },
  )
  return result
}

/** Removes the site's daily record (the entered FDC points, if any, take over). */
export function deleteFlowRecord(siteId: number): Promise<{ id: number; deleted: boolean }> {
  return $fetch<{ id: number; deleted: boolean }>(`/api/sites/${siteId}/flow-record`, { method: 'DELETE' })
}

/** The choices sent with a flow-record CSV. */
export interface FlowUploadOptions {
  mode: 'replace' | 'append'
  dateFormat: DateFormat
  dateColumn?: string
  flowColumn?: string
}

/** Upload state for a site's flow record: `progress` 0–1, `busy`, and `upload`. */
export function useFlowRecordUpload(siteId: Ref<number>) {
  const { progress, busy, send } = useUpload()

  async function upload(file: File, options: FlowUploadOptions): Promise<FlowUploadOutcome> {
    const form = new FormData()
    form.append('file', file, file.name)
    form.append('mode', options.mode)
    form.append('dateFormat', options.dateFormat)
    if (options.dateColumn) form.append('dateColumn', options.dateColumn)
    if (options.flowColumn) form.append('flowColumn', options.flowColumn)
    try {
      const result = await send<FlowUploadResult>(`/api/sites/${siteId.value}/flow-record`, form)
      if (!result) return { kind: 'failed', status: 0, message: 'The server answered without a summary' }
      return { kind: 'stored', result }
    } catch (error) {
      return uploadOutcomeFromError(error)
    }
  }

  return { progress, busy, upload }
}
