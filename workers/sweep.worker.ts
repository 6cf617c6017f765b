// Web Worker of the sweep page: runs the engine's sweep one grid point at a time so the page can show
// progress per point. Pure shared/engine code; the page picks the best acceptable point from the points.
import { sweep } from '../shared/engine/sweep'
import type { SweepWorkerMessage, SweepWorkerRequest } from '../utils/sweep'

const post = (m: SweepWorkerMessage) => (self as unknown as { postMessage: (m: SweepWorkerMessage) => void }).postMessage(m)

self.onmessage = (e: MessageEvent<SweepWorkerRequest>) => {
  const { input, grid } = e.data
  const total = grid.throatDiameters_m.length * grid.units.length * grid.throatDepths_m.length
  const points = []
  try {
    for (const dt of grid.throatDiameters_m) {
      for (const n of grid.units) {
        for (const depth of grid.throatDepths_m) {
          const one = sweep(input, { throatDiameters_m: [dt], units: [n], throatDepths_m: [depth] }).points[0]
          if (one) points.push(one)
          post({ type: 'progress', done: points.length, total })
        }
      }
    }
    post({ type: 'done', points })
  } catch (error) {
    const field = (error as { field?: unknown }).field
    post({ type: 'error', message: `${typeof field === 'string' ? `${field}: ` : ''}${error instanceof Error ? error.message : String(error)}` })
  }
}
