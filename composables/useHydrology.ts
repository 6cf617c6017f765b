// Typed wrappers over a site's hydrology routes: the curve in use and its statistics, the stored
// daily flow record, and the CSV upload (with progress, see useUpload).
import type { DateFormat, FlowRecordDto, FlowUploadErrorData, FlowUploadResult, HydrologyDto } from '~~/shared/schemas/site'
import { UploadError, useUpload } from './useUpload'

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

/** What an upload came to: stored, refused line by line, or waiting for the user to pick columns. */
export type FlowUploadOutcome =
  | { kind: 'stored'; result: FlowUploadResult }
  | { kind: 'lines'; message: string; errors: FlowUploadErrorData['errors']; count: number }
  | { kind: 'columns'; message: string; header: string[] }
  | { kind: 'failed'; status: number; message: string }

/** Reads a failed upload's answer into an outcome the upload panel can show. */
export function uploadOutcomeFromError(error: unknown): FlowUploadOutcome {
  if (error instanceof UploadError) {
    const body = error.data as { message?: string; data?: Partial<FlowUploadErrorData> } | null
    const data = body?.data
    const message = body?.message ?? error.message
    if (error.statusCode === 422 && data?.needsColumns && Array.isArray(data.header)) return { kind: 'columns', message, header: data.header }
    if (error.statusCode === 422 && Array.isArray(data?.errors) && data.errors.length) return { kind: 'lines', message, errors: data.errors, count: typeof data.errorCount === 'number' ? data.errorCount : data.errors.length }
    if (error.statusCode === 413) return { kind: 'failed', status: 413, message: 'The file is larger than the 10 MB limit. Split the record, upload the first part, then append the rest.' }
    if (error.statusCode === 415) return { kind: 'failed', status: 415, message: `${message.replace(/^file: /, '')}. Save the record as a CSV or plain-text file.` }
    return { kind: 'failed', status: error.statusCode, message }
  }
  return { kind: 'failed', status: 0, message: error instanceof Error ? error.message : 'The upload failed' }
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
