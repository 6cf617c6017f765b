import { resolve } from 'node:path'
import fsDriver from 'unstorage/drivers/fs'

let mounted: Promise<void> | undefined

/**
 * The uploads storage (attachments). nuxt.config.ts mounts `uploads` at the folder UPLOADS_DIR named
 * when the app was built; this re-mounts it on first use at UPLOADS_DIR as the running server sees it
 * (default .data/uploads), so a built server can be pointed elsewhere without a rebuild.
 */
export async function uploadsStorage() {
  mounted ??= (async () => {
    const storage = useStorage()
    await storage.unmount('uploads')
    storage.mount('uploads', fsDriver({ base: resolve(process.env.UPLOADS_DIR || '.data/uploads') }))
  })()
  await mounted
  return useStorage('uploads')
}
