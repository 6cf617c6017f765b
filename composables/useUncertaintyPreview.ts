// A Monte Carlo preview of a stored assessment with another seed or number of draws, run in a Web
// Worker (workers/uncertainty.worker.ts) so the page stays responsive; never stored.
import { onBeforeUnmount, ref, shallowRef } from 'vue'
import type { UncertaintyResult } from '#shared/engine/monteCarlo'
import type { AssessInput } from '#shared/schemas/assess'
import type { UncertaintyWorkerMessage, UncertaintyWorkerRequest } from '../utils/howSure'

/** Running previews: the latest result, whether one is running, and why the last one failed. */
export function useUncertaintyPreview() {
  const result = shallowRef<UncertaintyResult | null>(null)
  const running = ref(false)
  const error = ref('')
  let worker: Worker | null = null

  function stop() {
    worker?.terminate()
    worker = null
    running.value = false
  }

  /** Runs `draws` draws from `seed` on the stored `input`. */
  function run(input: AssessInput, draws: number, seed: number) {
    stop()
    error.value = ''
    if (typeof Worker === 'undefined') {
      error.value = 'This browser cannot run a preview (no Web Workers); the stored figures above stand.'
      return
    }
    try {
      worker = new Worker(new URL('../workers/uncertainty.worker.ts', import.meta.url), { type: 'module' })
    } catch {
      error.value = 'The preview could not start in this browser; the stored figures above stand.'
      return
    }
    running.value = true
    worker.onmessage = (e: MessageEvent<UncertaintyWorkerMessage>) => {
      if (e.data.type === 'done') result.value = e.data.result
      else error.value = e.data.message
      stop()
    }
    worker.onerror = () => {
      error.value = 'The preview stopped with an error; the stored figures above stand.'
      stop()
    }
    const request: UncertaintyWorkerRequest = { input: JSON.parse(JSON.stringify(input)) as AssessInput, draws, seed }
    worker.postMessage(request)
  }

  onBeforeUnmount(stop)
  return { result, running, error, run, stop }
}
