// Live preview of an option while it is edited: the engine from shared/ runs in the browser on the
// site (as stored) and the draft option, debounced, keeping the last good figures when the draft is
// not valid. The engine is imported lazily so pages without a preview do not ship it.
import type { AssessResult } from '#shared/engine/results'
import type { SiteDto } from '#shared/schemas/site'
import type { FlowRecordDto } from '#shared/schemas/flowRecord'
import type { OptionDraft } from '../utils/optionFields'
import { computePreview, createPreviewRunner, PREVIEW_DELAY_MS, PreviewInputError, type PreviewSite, previewSiteFrom, type PreviewState } from '../utils/preview'

/**
 * The live preview of `draft` at `site` (client side only): recomputes 300 ms after the last edit.
 * `site` null (still loading, or not assessable) shows `siteError` instead.
 */
export function useLivePreview(site: Ref<PreviewSite | null>, draft: OptionDraft) {
  const state = shallowRef<PreviewState<AssessResult>>({ result: null, error: null, pending: false, runs: 0 })
  let engine: Promise<typeof import('#shared/engine/assess')> | null = null
  const runner = createPreviewRunner(
    async (snapshot: { site: PreviewSite; draft: OptionDraft }) => {
      engine ??= import('#shared/engine/assess')
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
