// The design sweep of an option: the grid (utils/sweep.ts) run in a Web Worker from shared/engine
// with progress per point, or on the server when no worker can start.
import { ref, shallowRef } from 'vue'
import type { SweepPoint } from '#shared/engine/sweep'
import type { AssessInput, SweepGrid } from '#shared/schemas/assess'
import type { OptionSweepDto } from '#shared/schemas/option'
import type { SweepWorkerMessage, SweepWorkerRequest } from '../utils/sweep'

/** Running a sweep: in a worker when the browser can, else on the server (no per-point progress). */
export function useSweep() {
  const points = shallowRef<SweepPoint[] | null>(null)
  const progress = ref<{ done: number; total: number } | null>(null)
  const running = ref(false)
  const where = ref<'worker' | 'server' | null>(null)
  const error = ref('')
  let worker: Worker | null = null

  function stop() {
    worker?.terminate()
    worker = null
    running.value = false
  }

  async function onServer(optionId: number, grid: SweepGrid) {
    where.value = 'server'
    progress.value = null
    try {
      const r = await $fetch<OptionSweepDto>(`/api/options/${optionId}/sweep`, { method: 'POST', body: { grid } })
      points.value = r.points
    } catch (e) {
      error.value = (e as { data?: { message?: string } }).data?.message ?? (e instanceof Error ? e.message : 'The sweep failed.')
    } finally {
      running.value = false
    }
  }

  /** Runs the grid on `input` (the option at its site); falls back to the server route for `optionId`. */
  async function run(input: AssessInput | null, grid: SweepGrid, optionId: number) {
    stop()
    error.value = ''
    points.value = null
    running.value = true
    if (!input || typeof Worker === 'undefined') return onServer(optionId, grid)
    try {
      worker = new Worker(new URL('../workers/sweep.worker.ts', import.meta.url), { type: 'module' })
    } catch {
      return onServer(optionId, grid)
    }
    where.value = 'worker'
    progress.value = { done: 0, total: grid.throatDiameters_m.length * grid.units.length * grid.throatDepths_m.length }
    worker.onmessage = (e: MessageEvent<SweepWorkerMessage>) => {
      const m = e.data
      if (m.type === 'progress') progress.value = { done: m.done, total: m.total }
      else if (m.type === 'done') {
        points.value = m.points
        stop()
      } else {
        error.value = m.message
        stop()
      }
    }
    worker.onerror = () => {
      // A worker that cannot load (old browser, blocked script): do the same work on the server.
      stop()
      running.value = true
      void onServer(optionId, grid)
    }
    const request: SweepWorkerRequest = { input: JSON.parse(JSON.stringify(input)) as AssessInput, grid }
    worker.postMessage(request)
  }

  return { points, progress, running, where, error, run, stop }
}
