// Upload state for one form: progress and busy, over sendWithProgress (utils/upload.ts).
import { readonly, ref } from 'vue'
import { sendWithProgress } from '../utils/upload'

/** Upload state for one form: `progress` 0–1 while busy, and `send` to start. */
export function useUpload() {
  const progress = ref(0)
  const busy = ref(false)

  /** Uploads `form` to `url`; throws UploadError for a 4xx/5xx answer. */
  async function send<T>(url: string, form: FormData): Promise<T | null> {
    busy.value = true
    progress.value = 0
    try {
      const answer = await sendWithProgress<T>(url, form, (f) => (progress.value = f))
      return answer.body
    } finally {
      busy.value = false
    }
  }

  return { progress: readonly(progress), busy: readonly(busy), send }
}
