// What the engine benchmark runs, bundled by build/nodeWorker.ts exactly as the server's engine worker
// is (one minified ES module), so the figures are those of the engine as it ships, not of a
// per-file transform that turns every imported constant into a getter call.
export { assess } from '../../shared/engine/assess'
export { fdcFromRecord } from '../../shared/engine/hydrology'
export { monteCarlo } from '../../shared/engine/monteCarlo'
export { AssessInputSchema } from '../../shared/schemas/assess'
