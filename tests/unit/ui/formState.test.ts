// useFormState: the one form state of the editors (draft, dirty, reset, toBody, save with the
// version, the 409 conflict, the server's field messages). A small stand-in schema keeps these
// checks apart from any real editor's field names.
import { describe, expect, it, vi } from 'vitest'
import { nextTick, ref } from 'vue'
import { z } from 'zod'
import { useFormState } from '../../../composables/useFormState'
import { copyPlain, samePlain } from '../../../utils/formState'

/** What the server stores and answers. */
interface Weir {
  id: number
  version: number
  name: string
  heightM: number
  tags: string[]
}
/** What the inputs hold: a number may be blank (null) or wrongly typed (NaN). */
interface WeirDraft {
  name: string
  height: number | null
  tags: string[]
}

const WeirPatchSchema = z.object({
  name: z.string().trim().min(1, 'is required'),
  heightM: z.number({ error: 'must be a number' }).positive('must be more than 0'),
  tags: z.array(z.string()),
  version: z.number().int().min(1),
})

const stored = (over: Partial<Weir> = {}): Weir => ({ id: 4, version: 3, name: 'Low weir', heightM: 1.5, tags: ['gauge'], ...over })
const draftOf = (w: Weir): WeirDraft => ({ name: w.name, height: w.heightM, tags: w.tags })
const toBody = (d: WeirDraft) => ({ name: d.name, heightM: d.height, tags: d.tags })

/** A FetchError-like refusal as $fetch throws it. */
function refusal(statusCode: number, message: string, data?: Record<string, unknown>) {
  return Object.assign(new Error(message), { statusCode, data: { statusCode, message, data } })
}

function weirForm(send: (body: z.output<typeof WeirPatchSchema>) => Promise<Weir>, site = ref(stored())) {
  const form = useFormState({ stored: () => site.value, draftOf, toBody, schema: WeirPatchSchema, send })
  return { form, site }
}

describe('useFormState', () => {
  it('starts from a deep copy of the stored value: editing the draft leaves the stored value alone', () => {
    const site = ref(stored())
    const { form } = weirForm(vi.fn(), site)
    form.draft.tags.push('fish pass')
    expect(site.value.tags).toEqual(['gauge'])
    expect(form.saved.value.tags).toEqual(['gauge'])
    expect(form.version.value).toBe(3)
  })

  it('is dirty by value: a change makes it dirty, putting the same value back makes it clean', () => {
    const { form } = weirForm(vi.fn())
    expect(form.dirty.value).toBe(false)
    form.draft.height = 2
    expect(form.dirty.value).toBe(true)
    form.draft.height = 1.5
    expect(form.dirty.value).toBe(false)
    form.draft.tags = ['gauge'] // a new array holding the same text
    expect(form.dirty.value).toBe(false)
    form.draft.tags[0] = 'eel pass'
    expect(form.dirty.value).toBe(true)
  })

  it('tells a wrongly typed number (NaN) from a blank one (null)', () => {
    const { form } = weirForm(vi.fn(), ref(stored()))
    form.draft.height = null
    const blank = form.dirty.value
    form.reset()
    form.draft.height = Number.NaN
    expect([blank, form.dirty.value]).toEqual([true, true])
    expect(samePlain({ a: Number.NaN }, { a: Number.NaN })).toBe(true)
    expect(samePlain({ a: Number.NaN }, { a: null })).toBe(false)
  })

  it('reset puts the last saved value back into the same draft object and forgets messages', () => {
    const { form } = weirForm(vi.fn())
    const draft = form.draft
    form.draft.name = ''
    form.draft.tags.push('x')
    expect(form.toBody()).toBeNull()
    expect(form.errors.value['name']).toBe('is required')
    form.reset()
    expect(form.draft).toBe(draft)
    expect(form.draft).toEqual({ name: 'Low weir', height: 1.5, tags: ['gauge'] })
    expect(form.dirty.value).toBe(false)
    expect(form.errors.value).toEqual({})
    expect(form.formError.value).toBe('')
  })

  it("toBody maps the draft through the editor's mapping, adds the version and checks it with the schema", () => {
    const { form } = weirForm(vi.fn())
    form.draft.height = 2.25
    expect(form.toBody()).toEqual({ name: 'Low weir', heightM: 2.25, tags: ['gauge'], version: 3 })
    form.draft.height = null
    expect(form.toBody()).toBeNull()
    expect(form.errors.value).toEqual({ heightM: 'must be a number' })
    expect(form.formError.value).toMatch(/need attention/)
  })

  it('a save sends the checked body with the version, then takes the answer as the saved value and version', async () => {
    const send = vi.fn(async (body: z.output<typeof WeirPatchSchema>) => stored({ version: body.version + 1, name: body.name.toUpperCase(), heightM: body.heightM }))
    const { form } = weirForm(send)
    form.draft.name = ' Mill weir '
    form.draft.height = 2
    const answer = await form.save()
    expect(send).toHaveBeenCalledWith({ name: 'Mill weir', heightM: 2, tags: ['gauge'], version: 3 })
    expect(answer?.version).toBe(4)
    expect(form.version.value).toBe(4)
    expect(form.saved.value).toEqual({ name: 'MILL WEIR', height: 2, tags: ['gauge'] })
    expect(form.draft.name).toBe('MILL WEIR')
    expect(form.dirty.value).toBe(false)
    expect(form.justSaved.value).toBe(true)
    expect(form.busy.value).toBe(false)
    // The next save goes at the new version.
    form.draft.height = 3
    await form.save()
    expect(send).toHaveBeenLastCalledWith(expect.objectContaining({ heightM: 3, version: 4 }))
  })

  it('sends nothing while the schema or the editor\'s own checks refuse the draft', async () => {
    const send = vi.fn()
    let rowsOk = false
    const form = useFormState({ stored: () => stored(), draftOf, toBody, schema: WeirPatchSchema, send, ready: () => rowsOk })
    expect(await form.save()).toBeNull()
    expect(form.tried.value).toBe(true)
    form.draft.name = ''
    rowsOk = true
    expect(await form.save()).toBeNull()
    expect(form.errors.value['name']).toBe('is required')
    expect(send).not.toHaveBeenCalled()
  })

  it('a 409 sets conflict with the version now stored, and keeps the draft and the version it had', async () => {
    const { form } = weirForm(() =>
      Promise.reject(refusal(409, 'version: the weir was changed by someone else (now version 5, you sent 3)', { currentVersion: 5, updatedAt: '2024-05-01T10:00:00.000Z' })),
    )
    form.draft.name = 'My name for it'
    expect(await form.save()).toBeNull()
    expect(form.conflict.value).toEqual({ version: 5, updatedAt: '2024-05-01T10:00:00.000Z', message: expect.stringMatching(/^version: /) })
    expect(form.draft.name).toBe('My name for it')
    expect(form.dirty.value).toBe(true)
    expect(form.version.value).toBe(3)
    expect(form.errors.value).toEqual({})
    expect(form.justSaved.value).toBe(false)
  })

  it('after a conflict, loading the stored site again (theirs) replaces the draft and clears the conflict', async () => {
    const site = ref(stored())
    const { form } = weirForm(() => Promise.reject(refusal(409, 'version: stale', { currentVersion: 5 })), site)
    form.draft.name = 'Mine'
    await form.save()
    site.value = stored({ version: 5, name: 'Theirs' })
    await nextTick()
    expect(form.conflict.value).toBeNull()
    expect(form.draft.name).toBe('Theirs')
    expect(form.version.value).toBe(5)
  })

  it('a newer stored value flows into a clean draft; edits in progress are kept, the version follows', async () => {
    const site = ref(stored())
    const { form } = weirForm(vi.fn(), site)
    site.value = stored({ version: 4, heightM: 1.7 })
    await nextTick()
    expect(form.draft.height).toBe(1.7)
    form.draft.name = 'Being edited'
    site.value = stored({ version: 5, heightM: 1.9 })
    await nextTick()
    expect(form.draft).toEqual({ name: 'Being edited', height: 1.7, tags: ['gauge'] })
    expect(form.version.value).toBe(5)
    form.reset()
    expect(form.draft.height).toBe(1.9)
  })

  it("maps a 400/422's issues onto the fields, and shows a refusal without fields as the form's message", async () => {
    const send = vi.fn()
    const { form } = weirForm(send)
    send.mockRejectedValueOnce(refusal(422, 'heightM: must be below the bank (2 m)', { issues: [{ path: 'heightM', message: 'must be below the bank (2 m)' }] }))
    await form.save()
    expect(form.errors.value).toEqual({ heightM: 'must be below the bank (2 m)' })
    expect(form.formError.value).toMatch(/need attention/)
    expect(form.conflict.value).toBeNull()
    send.mockRejectedValueOnce(refusal(403, 'This needs the admin or engineer role; you are viewer'))
    await form.save()
    expect(form.errors.value).toEqual({})
    expect(form.formError.value).toBe('This needs the admin or engineer role; you are viewer')
  })

  it('a new thing (no version) sends no version, and a 409 on it is a message, not a conflict', async () => {
    const send = vi.fn().mockRejectedValueOnce(refusal(409, 'name: already taken'))
    const form = useFormState({ blank: { name: 'New weir', height: 1, tags: [] }, draftOf, toBody, schema: WeirPatchSchema.omit({ version: true }), send })
    expect(form.version.value).toBeNull()
    await form.save()
    expect(send).toHaveBeenCalledWith({ name: 'New weir', heightM: 1, tags: [] })
    expect(form.conflict.value).toBeNull()
    expect(form.formError.value).toBe('name: already taken')
  })

  it('with recheck, an edit after a refused save checks again at once', async () => {
    const form = useFormState({ stored: () => stored(), draftOf, toBody, schema: WeirPatchSchema, send: vi.fn(), recheck: true })
    form.draft.name = ''
    form.draft.height = null
    expect(form.errors.value).toEqual({}) // nothing checked before a save is tried
    await form.save()
    expect(Object.keys(form.errors.value).sort()).toEqual(['heightM', 'name'])
    form.draft.name = 'Fixed'
    expect(form.errors.value).toEqual({ heightM: 'must be a number' })
  })

  it('copies plain data deeply, keeping NaN', () => {
    const value = { a: [1, { b: Number.NaN }], c: null }
    const copy = copyPlain(value)
    expect(copy).not.toBe(value)
    expect(copy.a[1]).not.toBe(value.a[1])
    expect(samePlain(copy, value)).toBe(true)
  })
})
