import { describe, expect, it } from 'vitest'
import { ref } from 'vue'
import { useHeadTableDraft } from '../../../composables/useHeadTableDraft'
import { blankHeadRow } from '../../../utils/headTable'

describe('useHeadTableDraft', () => {
  it('starts from the stored table, clean and without messages', () => {
    const head = useHeadTableDraft([{ flow: 1, head: 1.4 }, { flow: 20, head: 1.1 }], {})
    expect(head.rows.value.map((r) => [r.flow, r.head])).toEqual([['1', '1.4'], ['20', '1.1']])
    expect(head.dirty.value).toBe(false)
    expect(head.rowErrors.value).toEqual([{}, {}])
    expect(head.formError.value).toBe('')
  })

  it('keeps a wrong row quiet until a save is tried, then refuses to give the table and says why', () => {
    const head = useHeadTableDraft([], {})
    head.rows.value = [{ ...blankHeadRow(), flow: '10', head: '1.2' }, { ...blankHeadRow(), flow: '5', head: '1.3' }]
    expect(head.dirty.value).toBe(true)
    expect(head.rowErrors.value[1]).toEqual({})
    expect(head.take()).toBeNull()
    expect(head.rowErrors.value[1]?.flow).toMatch(/must rise down the table/)
    expect(head.formError.value).toMatch(/head table needs attention/)
  })

  it('gives the checked table of good rows; an empty table is a table too', () => {
    const head = useHeadTableDraft([], {})
    expect(head.take()).toEqual([])
    head.rows.value = [{ ...blankHeadRow(), flow: '0,5', head: '1.5' }, { ...blankHeadRow(), flow: '30', head: '0' }]
    expect(head.take()).toEqual([{ flow: 0.5, head: 1.5 }, { flow: 30, head: 0 }])
    expect(head.formError.value).toBe('')
  })

  it("shows the server's per-row messages for the rows it refused, until those rows change", () => {
    const serverErrors = ref<Record<string, string>>({})
    const head = useHeadTableDraft([{ flow: 1, head: 1 }, { flow: 2, head: 1 }], serverErrors)
    expect(head.take()).not.toBeNull()
    serverErrors.value = { 'headTable.1.head': 'head: too high for this weir', 'name': 'name: is required' }
    expect(head.rowErrors.value[1]).toEqual({ head: 'head: too high for this weir' })
    head.rows.value[1]!.head = '0.9'
    expect(head.rowErrors.value[1]).toEqual({})
  })

  it('reset goes back to a stored table and forgets messages', () => {
    const head = useHeadTableDraft([], {})
    head.rows.value = [{ ...blankHeadRow(), flow: 'x', head: '' }]
    head.take()
    head.reset([{ flow: 3, head: 2 }])
    expect(head.rows.value.map((r) => [r.flow, r.head])).toEqual([['3', '2']])
    expect(head.dirty.value).toBe(false)
    expect(head.formError.value).toBe('')
    expect(head.rowErrors.value).toEqual([{}])
  })
})
