import { mkdir, readdir, rename, rm, stat } from 'node:fs/promises'
import { join, resolve } from 'node:path'
import fsDriver from 'unstorage/drivers/fs'
import { attachmentKeys } from '../domain/attachments'

// The uploads folder (UPLOADS_DIR, default .data/uploads) holds one file per attachment, named by its
// random storage key. An upload is written to `.pending/<key>` while it arrives; its row is stored,
// and only then is the file renamed to `<key>`. So a file under its final name always has a row, a
// pending file of a failed upload is removed at once, and what a crash leaves is put right by
// sweepUploads when the server starts.

/** Pending files younger than this may be uploads still arriving (at another server on the same folder). */
const PENDING_GRACE_MS = 5 * 60 * 1000
const PENDING = '.pending'
const KEY = /^[A-Za-z0-9_-]{8,}$/

/** The uploads folder as the running server sees it. */
export function uploadsDir(): string {
  return resolve(process.env.UPLOADS_DIR || '.data/uploads')
}

function checkedKey(key: string): string {
  if (!KEY.test(key)) throw new Error(`not a storage key: ${JSON.stringify(key)}`)
  return key
}

let mounted: Promise<void> | undefined

/**
 * The uploads storage (attachments), for reading. nuxt.config.ts mounts `uploads` at the folder
 * UPLOADS_DIR named when the app was built; this re-mounts it on first use at uploadsDir(), so a
 * built server can be pointed elsewhere without a rebuild.
 */
export async function uploadsStorage() {
  mounted ??= (async () => {
    const storage = useStorage()
    await storage.unmount('uploads')
    storage.mount('uploads', fsDriver({ base: uploadsDir() }))
  })()
  await mounted
  return useStorage('uploads')
}

/** Where the upload for `key` is written while it arrives (the folder is created when missing). */
export async function pendingUploadPath(key: string): Promise<string> {
  const dir = join(uploadsDir(), PENDING)
  await mkdir(dir, { recursive: true })
  return join(dir, checkedKey(key))
}

/** Gives a pending upload its final name, once its row is stored. */
export async function commitUpload(key: string): Promise<void> {
  const dir = uploadsDir()
  try {
    await rename(join(dir, PENDING, checkedKey(key)), join(dir, key))
  } catch (error) {
    // The start-up sweep of another server on this folder may have finished it already.
    if ((error as NodeJS.ErrnoException).code === 'ENOENT' && (await stat(join(dir, key)).catch(() => null))) return
    throw error
  }
}

/** Removes a pending upload (refused, or its row could not be stored). */
export async function discardPendingUpload(key: string): Promise<void> {
  await rm(join(uploadsDir(), PENDING, checkedKey(key)), { force: true })
}

/** Removes the file of a deleted attachment. */
export async function removeUpload(key: string): Promise<void> {
  await rm(join(uploadsDir(), checkedKey(key)), { force: true })
}

/** Files (not folders, not dot-files) directly in `dir`; none when it does not exist. */
async function filesIn(dir: string): Promise<string[]> {
  const entries = await readdir(dir, { withFileTypes: true }).catch((error: NodeJS.ErrnoException) => {
    if (error.code === 'ENOENT') return []
    throw error
  })
  return entries.filter((e) => e.isFile() && !e.name.startsWith('.')).map((e) => e.name)
}

/**
 * Puts the uploads folder in step with the attachments table, for the server's start: a pending file
 * older than a few minutes is renamed to its final name when its row was stored (the server stopped
 * between the two) and removed otherwise; a file no live attachment names (its upload failed, or its
 * attachment was deleted) is removed. Files are listed before rows are read, so an upload finished
 * meanwhile is never taken for an orphan. When the table has no rows at all but the folder holds
 * files, the database is likely not the one these files belong to: they are left alone, with a warning.
 */
export async function sweepUploads(now = Date.now()): Promise<{ removed: number; finished: number }> {
  const dir = uploadsDir()
  const pendingDir = join(dir, PENDING)
  const finals = await filesIn(dir)
  const pending = await filesIn(pendingDir)
  const rows = await attachmentKeys(useDb())
  const live = new Set(rows.filter((r) => r.live).map((r) => r.storageKey))
  let removed = 0
  let finished = 0
  for (const name of pending) {
    const path = join(pendingDir, name)
    const info = await stat(path).catch(() => null)
    if (!info || now - info.mtimeMs < PENDING_GRACE_MS) continue
    if (live.has(name) && !finals.includes(name)) {
      await rename(path, join(dir, name))
      finals.push(name)
      finished++
    } else {
      await rm(path, { force: true })
      removed++
    }
  }
  const orphans = finals.filter((name) => !live.has(name))
  if (rows.length === 0 && orphans.length > 0) {
    console.warn(`[gillwatt] ${orphans.length} files in ${dir} but no attachment in the database: is DATABASE_PATH the right file? Left alone.`)
    return { removed, finished }
  }
  for (const name of orphans) {
    await rm(join(dir, name), { force: true })
    removed++
  }
  return { removed, finished }
}
