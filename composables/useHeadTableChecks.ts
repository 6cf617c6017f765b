// The messages of the head table being edited inside a site form (new site, overview), whose rows
// live in the form's draft: the rows' own checks once the user has tried to save, and the server's
// per-row issues for as long as the refused rows stand unchanged.
import { computed, ref, toValue, type MaybeRefOrGetter } from 'vue'
import { checkHeadRows, headRowErrorsFromIssues, headTableText, type HeadTableRow } from '../utils/headTable'

/**
 * Messages for `rows`: `serverErrors` are the form's messages by field path (the server's land there),
 * `shown` says whether a save was tried (the form's `tried`).
 */
export function useHeadTableChecks(rows: () => readonly HeadTableRow[], serverErrors: MaybeRefOrGetter<Record<string, string>>, shown: MaybeRefOrGetter<boolean>) {
  const check = computed(() => checkHeadRows(rows()))
  /** The rows' text when they were last sent; the server's messages stand until the rows change. */
  const sentText = ref<string | null>(null)

  const server = computed(() =>
    sentText.value === headTableText(rows()) ? headRowErrorsFromIssues(toValue(serverErrors), rows().length) : { rowErrors: [], tableError: '' },
  )
  const rowErrors = computed(() => rows().map((_, i) => ({ ...server.value.rowErrors[i], ...(toValue(shown) ? check.value.rowErrors[i] : {}) })))
  const tableError = computed(() => (toValue(shown) && check.value.tableError) || server.value.tableError)
  /** A message for the form's save bar while the rows' own checks fail after a save was tried, else ''. */
  const formError = computed(() => (toValue(shown) && !check.value.table ? 'The head table needs attention; see the messages in it.' : ''))

  /** On save (the form's `ready`): notes the rows as sent and says whether they pass their own checks. */
  function take(): boolean {
    sentText.value = headTableText(rows())
    return check.value.table !== null
  }

  return { rowErrors, tableError, formError, take }
}
