// Live preview of an option while it is edited: the engine from shared/ runs in the browser on the
// site (as stored) and the draft option, debounced, keeping the last good figures when the draft is
// not valid. The engine is imported lazily so pages without a preview do not ship it.
import type { AssessResult } from '~~/shared/engine/assess'
import { AssessInputSchema, OptionInputSchema as EngineOptionSchema, SettingsInputSchema, type AssessInput } from '~~/shared/schemas/assess'
import type { FlowRecordDto, SiteDto } from '~~/shared/schemas/site'
import { siteToEngine, SiteNotReadyError, type EngineSitePart, type SiteForEngine } from '~~/shared/utils/siteEngineInput'
import { bodyFromDraft, type OptionDraft } from './useOptions'

/** Debounce of the live preview, ms. */
export const PREVIEW_DELAY_MS = 300

/** The site's part of an engine input, assembled once per site. */
export type PreviewSite = EngineSitePart

/** The preview cannot run: `field` names the input to fix (`design.throatDiameter_m`, `site.hydrology`). */
export class PreviewInputError extends Error {
  override readonly name = 'PreviewInputError'
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message)
  }
}

/**
 * The site's part of the engine input: `siteToEngine`, the same mapping the server uses for stored
 * assessments. `days` are the site's daily flows as GET /api/sites/[id]/flow-record gives them,
 * already scaled to the site. Throws PreviewInputError when the site cannot be assessed yet.
 */
export function previewSiteFrom(site: SiteForEngine, days: { date: string; flow: number | null }[] | null): PreviewSite {
  try {
    return siteToEngine(site, days ? { days, scale: null } : null)
  } catch (error) {
    if (error instanceof SiteNotReadyError) throw new PreviewInputError(error.field, error.message)
    throw error
  }
}

/** The engine input for the draft at the site, defaults filled in; throws PreviewInputError naming the first bad field. */
export function assembleInput(site: PreviewSite, draft: OptionDraft): AssessInput {
  // The option's name is not needed to preview figures: only the design and the settings are checked.
  const body = bodyFromDraft(draft)
  const design = EngineOptionSchema.safeParse(body.design)
  const settings = SettingsInputSchema.safeParse(body.settings)
  for (const [prefix, r] of [['design', design], ['settings', settings]] as const) {
    if (!r.success) {
      const issue = r.error.issues[0]!
      throw new PreviewInputError([prefix, ...issue.path.map(String)].join('.'), issue.message)
    }
  }
  const { targetOxygen_mgL, ...rest } = site
  const parsed = AssessInputSchema.safeParse({ ...rest, option: design.data, settings: { ...settings.data, oxygenTarget_mgL: targetOxygen_mgL } })
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    const path = issue.path.map(String).join('.').replace(/^option\./, 'design.')
    throw new PreviewInputError(path || 'input', issue.message)
  }
  return parsed.data
}

/** Runs `assessFn` on the draft at the site; an engine input error becomes a PreviewInputError on its field. */
export function computePreview(assessFn: (input: AssessInput) => AssessResult, site: PreviewSite, draft: OptionDraft): AssessResult {
  const input = assembleInput(site, draft)
  try {
    return assessFn(input)
  } catch (error) {
    const field = (error as { field?: unknown }).field
    if (typeof field === 'string') throw new PreviewInputError(field, (error as Error).message)
    throw error
  }
}

/** What the preview shows. */
export interface PreviewState<R> {
  /** The last good result; kept while the draft has an error. */
  result: R | null
  /** Why the newest draft could not be previewed, naming the field; null when it could. */
  error: { field: string; message: string } | null
  /** True from a change until its run has finished. */
  pending: boolean
  /** How many runs have finished with a result. */
  runs: number
}

/**
 * A debounced runner: `schedule(input)` waits `delayMs` after the last call, then runs `compute`.
 * A newer schedule discards an older run's answer; errors keep the last good result.
 */
export function createPreviewRunner<I, R>(compute: (input: I) => R | Promise<R>, delayMs: number, onState: (s: PreviewState<R>) => void) {
  const state: PreviewState<R> = { result: null, error: null, pending: false, runs: 0 }
  let timer: ReturnType<typeof setTimeout> | null = null
  let seq = 0
  const emit = () => onState({ ...state })

  async function run(input: I, mySeq: number) {
    try {
      const result = await compute(input)
      if (mySeq !== seq) return
      state.result = result
      state.error = null
      state.runs += 1
    } catch (error) {
      if (mySeq !== seq) return
      const field = (error as { field?: unknown }).field
      state.error = { field: typeof field === 'string' ? field : 'input', message: error instanceof Error ? error.message : String(error) }
    }
    state.pending = false
    emit()
  }

  function schedule(input: I) {
    if (timer) clearTimeout(timer)
    seq += 1
    const mySeq = seq
    state.pending = true
    emit()
    timer = setTimeout(() => {
      timer = null
      void run(input, mySeq)
    }, delayMs)
  }

  function dispose() {
    if (timer) clearTimeout(timer)
    timer = null
    seq += 1
  }

  return { schedule, dispose, state: () => ({ ...state }) }
}

/**
 * The live preview of `draft` at `site` (client side only): recomputes 300 ms after the last edit.
 * `site` null (still loading, or not assessable) shows `siteError` instead.
 */
export function useLivePreview(site: Ref<PreviewSite | null>, draft: OptionDraft) {
  const state = shallowRef<PreviewState<AssessResult>>({ result: null, error: null, pending: false, runs: 0 })
  let engine: Promise<typeof import('~~/shared/engine/assess')> | null = null
  const runner = createPreviewRunner(
    async (snapshot: { site: PreviewSite; draft: OptionDraft }) => {
      engine ??= import('~~/shared/engine/assess')
      const { assess } = await engine
      return computePreview(assess, snapshot.site, snapshot.draft)
    },
    PREVIEW_DELAY_MS,
    (s) => (state.value = s),
  )
  const kick = () => {
    if (import.meta.server || !site.value) return
    runner.schedule({ site: site.value, draft: structuredClone(toRaw({ name: draft.name, notes: draft.notes, values: { ...draft.values } })) })
  }
  // Start after mounting, so the first client render matches the server's (no run there).
  onMounted(() => watch([site, () => JSON.stringify(draft.values)], kick, { immediate: true }))
  onBeforeUnmount(() => runner.dispose())
  return { state }
}

/**
 * The site's part of the preview input, from the stored site and (for a record) its daily flows,
 * fetched in the browser only. `siteError` says why the site cannot be previewed yet.
 */
export function usePreviewSite(site: Ref<SiteDto | null | undefined>) {
  const days = shallowRef<{ date: string; flow: number | null }[] | null>(null)
  const loadError = ref('')
  const loading = ref(false)
  async function loadDays(s: SiteDto) {
    if (import.meta.server || s.hydrologySource !== 'record') return
    loading.value = true
    try {
      days.value = (await $fetch<FlowRecordDto>(`/api/sites/${s.id}/flow-record`)).days
    } catch (error) {
      loadError.value = `The site's flow record could not be read: ${error instanceof Error ? error.message : String(error)}`
    } finally {
      loading.value = false
    }
  }
  onMounted(() => watch(() => site.value && `${site.value.id}:${site.value.version}:${site.value.flowRecord?.uploadedAt ?? ''}`, () => site.value && loadDays(site.value), { immediate: true }))

  const built = computed<{ value: PreviewSite | null; error: string }>(() => {
    const s = site.value
    if (!s) return { value: null, error: '' }
    if (loadError.value) return { value: null, error: loadError.value }
    if (s.hydrologySource === 'record' && !days.value) return { value: null, error: '' }
    try {
      return { value: previewSiteFrom(s, s.hydrologySource === 'record' ? days.value : null), error: '' }
    } catch (error) {
      return { value: null, error: error instanceof PreviewInputError ? `${error.field}: ${error.message}` : String(error) }
    }
  })
  return {
    previewSite: computed(() => built.value.value),
    siteError: computed(() => built.value.error),
    loading,
  }
}
