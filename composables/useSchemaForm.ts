import type { z, ZodType } from 'zod'
import { issuesFromError } from '../utils/serverErrors'

/**
 * Form state checked by the same zod schema the server uses: `check()` fills per-field errors
 * before sending, `fail(error)` maps the server's 4xx answer onto the same fields.
 */
export function useSchemaForm<S extends ZodType<Record<string, unknown>>>(schema: S, initial: z.input<S>) {
  type T = z.output<S>
  const values = reactive({ ...(initial as Record<string, unknown>) }) as z.input<S>
  const errors = ref<Record<string, string>>({})
  const formError = ref('')
  const busy = ref(false)

  function check(): T | null {
    const result = schema.safeParse(values)
    errors.value = {}
    formError.value = ''
    if (result.success) return result.data as T
    for (const issue of result.error.issues) errors.value[issue.path.join('.')] ??= issue.message
    return null
  }

  function fail(error: unknown) {
    const { fields, message } = issuesFromError(error)
    errors.value = fields
    formError.value = Object.keys(fields).length ? '' : message
  }

  /** Validates, then runs `send` with the parsed values, keeping `busy` and errors up to date. */
  async function submit(send: (data: T) => Promise<void>) {
    const data = check()
    if (!data) return
    busy.value = true
    try {
      await send(data)
    } catch (error) {
      fail(error)
    } finally {
      busy.value = false
    }
  }

  return { values, errors, formError, busy, check, fail, submit }
}
