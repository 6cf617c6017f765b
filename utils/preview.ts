// The live preview's pure parts: the engine input from the stored site and the draft option, the
// engine run (imported lazily so pages without a preview do not ship it), and a debounced runner
// that keeps the last good figures while the draft is not valid.
import type { AssessResult } from '#shared/engine/results'
import { AssessInputSchema, EngineOptionSchema, SettingsInputSchema, type AssessInput } from '#shared/schemas/assess'
import { siteToEngine, SiteNotReadyError, type EngineSitePart, type SiteForEngine } from '#shared/utils/siteEngineInput'
import { bodyFromDraft, type OptionDraft } from './optionFields'

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
