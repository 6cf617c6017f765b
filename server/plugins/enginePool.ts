// The engine's worker pool (server/utils/enginePool.ts): its first thread starts just after start-up,
// so the first calculation does not wait for one; not while plugins load, when the server's own URL
// (from which the worker file is found) is still a placeholder. Closing the server stops its threads.
export default defineNitroPlugin((nitroApp) => {
  setImmediate(() => warmEnginePool())
  nitroApp.hooks.hook('close', () => closeEnginePool())
})
