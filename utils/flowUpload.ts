// What a flow-record upload's refusal means for the form.
import type { FlowUploadErrorData, FlowUploadResult } from '#shared/schemas/flowRecord'
import { UploadError } from './upload'

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
