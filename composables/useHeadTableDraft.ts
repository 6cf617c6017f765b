// The head table being edited inside a site form (new site, overview): its text rows, whether they
// changed, and the messages to show: the rows' own checks once the user has tried to save, and the
// server's per-row issues for as long as the refused rows stand unchanged.
import { computed, ref, toValue, type MaybeRefOrGetter } from 'vue'
import type { HeadRow } from '~~/shared/schemas/site'
import { checkHeadRows, headRowErrorsFromIssues, headRowsFrom, headTableText } from '../utils/headTable'

export function useHeadTableDraft(initial: readonly HeadRow[], serverErrors: MaybeRefOrGetter<Record<string, string>>) {
  const rows = ref(headRowsFrom(initial))
  const baseline = ref(headTableText(rows.value))
  const dirty = computed(() => headTableText(rows.value) !== baseline.value)
  const check = computed(() => checkHeadRows(rows.value))
  const showErrors = ref(false)
  /** The rows' text when they were last sent; the server's messages stand until the rows change. */
  const sentText = ref<string | null>(null)

  const server = computed(() =>
    sentText.value === headTableText(rows.value) ? headRowErrorsFromIssues(toValue(serverErrors), rows.value.length) : { rowErrors: [], tableError: '' },
  )
  const rowErrors = computed(() => rows.value.map((_, i) => ({ ...server.value.rowErrors[i], ...(showErrors.value ? check.value.rowErrors[i] : {}) })))
  const tableError = computed(() => (showErrors.value && check.value.tableError) || server.value.tableError)
  /** A message for the form's save bar while the rows' own checks fail after a save was tried, else ''. */
  const formError = computed(() => (showErrors.value && !check.value.table ? 'The head table needs attention; see the messages in it.' : ''))

  /** On save: shows the rows' messages from now on and gives the table to send, or null while any row is wrong. */
  function take(): HeadRow[] | null {
    showErrors.value = true
    sentText.value = headTableText(rows.value)
    return check.value.table
  }

  /** Starts again from a stored table, with no messages. */
  function reset(table: readonly HeadRow[]) {
    rows.value = headRowsFrom(table)
    baseline.value = headTableText(rows.value)
    showErrors.value = false
    sentText.value = null
  }

  return { rows, dirty, rowErrors, tableError, formError, take, reset }
}
