import { describe, expect, it } from 'vitest'
import { ref } from 'vue'
import { useHeadTableChecks } from '../../../composables/useHeadTableChecks'
import { blankHeadRow, headRowsFrom, type HeadTableRow } from '../../../utils/headTable'

/** The rows as a form's draft holds them, whether a save was tried, and the form's messages. */
function table(rows: HeadTableRow[]) {
  const state = { rows: ref(rows), tried: ref(false), errors: ref<Record<string, string>>({}) }
  const head = useHeadTableChecks(() => state.rows.value, state.errors, state.tried)
  return { ...state, head }
}

describe('useHeadTableChecks', () => {
  it('starts without messages', () => {
    const { head } = table(headRowsFrom([{ flow: 1, head: 1.4 }, { flow: 20, head: 1.1 }]))
    expect(head.rowErrors.value).toEqual([{}, {}])
    expect(head.tableError.value).toBe('')
    expect(head.formError.value).toBe('')
  })

  it('keeps a wrong row quiet until a save is tried, then refuses the rows and says why', () => {
    const { head, tried } = table([{ ...blankHeadRow(), flow: '10', head: '1.2' }, { ...blankHeadRow(), flow: '5', head: '1.3' }])
    expect(head.rowErrors.value[1]).toEqual({})
    tried.value = true
    expect(head.take()).toBe(false)
    expect(head.rowErrors.value[1]?.flow).toMatch(/must rise down the table/)
    expect(head.formError.value).toMatch(/head table needs attention/)
  })

  it('passes good rows; an empty table is a table too', () => {
    const { head, rows, tried } = table([])
    tried.value = true
    expect(head.take()).toBe(true)
    rows.value = [{ ...blankHeadRow(), flow: '0,5', head: '1.5' }, { ...blankHeadRow(), flow: '30', head: '0' }]
    expect(head.take()).toBe(true)
    expect(head.formError.value).toBe('')
  })

  it("shows the server's per-row messages for the rows it refused, until those rows change", () => {
    const { head, rows, errors } = table(headRowsFrom([{ flow: 1, head: 1 }, { flow: 2, head: 1 }]))
    expect(head.take()).toBe(true)
    errors.value = { 'headTable.1.head': 'head: too high for this weir', 'name': 'name: is required' }
    expect(head.rowErrors.value[1]).toEqual({ head: 'head: too high for this weir' })
    rows.value[1]!.head = '0.9'
    expect(head.rowErrors.value[1]).toEqual({})
  })

  it('goes quiet again when the form is reset (no save tried, no messages)', () => {
    const { head, rows, tried, errors } = table([{ ...blankHeadRow(), flow: 'x', head: '' }])
    tried.value = true
    head.take()
    expect(head.rowErrors.value[0]).not.toEqual({})
    tried.value = false
    errors.value = {}
    rows.value = headRowsFrom([{ flow: 3, head: 2 }])
    expect(head.rowErrors.value).toEqual([{}])
    expect(head.formError.value).toBe('')
  })
})
