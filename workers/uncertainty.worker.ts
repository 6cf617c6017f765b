// Web Worker of the results page: runs the Monte Carlo (shared/engine/monteCarlo.ts) on a stored
// assessment's input with another seed or number of draws, as a preview that is never stored.
import { monteCarlo } from '../shared/engine/monteCarlo'
import type { UncertaintyWorkerMessage, UncertaintyWorkerRequest } from '../utils/howSure'

const post = (m: UncertaintyWorkerMessage) => (self as unknown as { postMessage: (m: UncertaintyWorkerMessage) => void }).postMessage(m)

self.onmessage = (e: MessageEvent<UncertaintyWorkerRequest>) => {
  const { input, draws, seed } = e.data
  try {
    post({ type: 'done', result: monteCarlo(input, draws, seed) })
  } catch (error) {
    const field = (error as { field?: unknown }).field
    post({ type: 'error', message: `${typeof field === 'string' ? `${field}: ` : ''}${error instanceof Error ? error.message : String(error)}` })
  }
}
