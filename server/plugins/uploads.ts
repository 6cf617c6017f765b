// Once migrations have run, puts the uploads folder in step with the attachments table: files left by
// uploads that a crash or a kill cut off go, and an upload whose row was stored gets its final name
// (server/utils/storage.ts sweepUploads). Uploads are served meanwhile; the sweep never touches a
// file an upload in progress may still be writing.
export default defineNitroPlugin(() => {
  if (import.meta.prerender) return
  databaseReady()
    .then(() => sweepUploads())
    .then(({ removed, finished }) => {
      if (removed || finished) console.info(`[gillwatt] uploads: removed ${removed} stray file(s), finished ${finished} stored upload(s) left pending`)
    })
    .catch((error: unknown) => console.error('[gillwatt] uploads sweep failed:', error))
})
