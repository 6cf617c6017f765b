// `import workerUrl from '…/x.worker?node-worker'` (build/nodeWorker.ts): a function giving the file
// URL of the bundled worker, for piscina's `filename`. Referenced with `/// <reference path>` from
// the module that imports it, so `nuxt typecheck` knows the import.
declare module '*?node-worker' {
  const workerUrl: () => string
  export default workerUrl
}
