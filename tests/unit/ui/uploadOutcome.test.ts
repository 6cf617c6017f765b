import { describe, expect, it } from 'vitest'
import { uploadOutcomeFromError } from '../../../utils/flowUpload'
import { UploadError } from '../../../utils/upload'

describe('uploadOutcomeFromError', () => {
  it('shows per-line errors from a 422', () => {
    const out = uploadOutcomeFromError(new UploadError(422, { statusCode: 422, message: 'file: 2 lines could not be read', data: { errors: [{ line: 3, reason: 'date is not a date' }, { line: 9, reason: 'flow is negative' }] } }))
    expect(out).toEqual({ kind: 'lines', message: 'file: 2 lines could not be read', errors: [{ line: 3, reason: 'date is not a date' }, { line: 9, reason: 'flow is negative' }], count: 2 })
  })

  it('counts every bad line when the server lists only the first ones', () => {
    const out = uploadOutcomeFromError(new UploadError(422, { message: 'file: line 2: … (and 49999 more lines)', data: { errors: [{ line: 2, reason: 'x' }], errorCount: 50_000 } }))
    expect(out).toMatchObject({ kind: 'lines', count: 50_000 })
  })

  it('asks for columns when the server sends the header', () => {
    const out = uploadOutcomeFromError(new UploadError(422, { message: 'file: which columns?', data: { errors: [], needsColumns: true, header: ['when', 'q', 'flag'] } }))
    expect(out).toEqual({ kind: 'columns', message: 'file: which columns?', header: ['when', 'q', 'flag'] })
  })

  it('explains 413 and 415 in plain words', () => {
    expect(uploadOutcomeFromError(new UploadError(413, { message: 'file: is larger than the 10 MB limit' }))).toMatchObject({ kind: 'failed', status: 413, message: expect.stringMatching(/10 MB/) })
    expect(uploadOutcomeFromError(new UploadError(415, { message: 'file: must be a CSV or text file' }))).toMatchObject({ kind: 'failed', status: 415, message: expect.stringMatching(/^must be a CSV/) })
  })

  it('passes other failures through with their message', () => {
    expect(uploadOutcomeFromError(new UploadError(403, { message: 'This needs the admin or engineer role' }))).toEqual({ kind: 'failed', status: 403, message: 'This needs the admin or engineer role' })
    expect(uploadOutcomeFromError(new UploadError(422, { message: 'file: has no day with a flow', data: { errors: [] } }))).toMatchObject({ kind: 'failed', message: 'file: has no day with a flow' })
  })
})
