// Sending a multipart upload with progress (XMLHttpRequest), and its refusal as an error.
/** What the server answered: the status and the parsed JSON body (or null). */
export interface UploadAnswer<T> {
  status: number
  body: T | null
}

/** Raised for a non-2xx answer; `data` is the parsed body like a $fetch error's. */
export class UploadError extends Error {
  constructor(
    public readonly statusCode: number,
    public readonly data: unknown,
  ) {
    const message = (data as { message?: unknown } | null)?.message
    super(typeof message === 'string' && message ? message : `Upload failed (HTTP ${statusCode})`)
    this.name = 'UploadError'
  }
}

/** Sends `form` with XMLHttpRequest, reporting the sent fraction 0–1 to `onProgress`. */
export function sendWithProgress<T>(url: string, form: FormData, onProgress: (fraction: number) => void, method = 'POST'): Promise<UploadAnswer<T>> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest()
    xhr.open(method, url)
    xhr.responseType = 'text'
    xhr.setRequestHeader('Accept', 'application/json')
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total)
    }
    xhr.onload = () => {
      let body: T | null = null
      try {
        body = xhr.responseText ? (JSON.parse(xhr.responseText) as T) : null
      } catch {
        body = null
      }
      onProgress(1)
      if (xhr.status >= 200 && xhr.status < 300) resolve({ status: xhr.status, body })
      else reject(new UploadError(xhr.status, body))
    }
    xhr.onerror = () => reject(new UploadError(0, { message: 'The upload did not reach the server; check the connection and try again.' }))
    xhr.onabort = () => reject(new UploadError(0, { message: 'The upload was cancelled.' }))
    xhr.send(form)
  })
}
