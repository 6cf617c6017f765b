import { basename, dirname, resolve } from 'node:path'
import { build } from 'esbuild'
import type { Plugin } from 'rollup'

// Worker threads for the built server. Nitro bundles the server into chunks, so a path to a `.ts`
// file does not exist after `npm run build`. An import ending in `?node-worker`
// (`import workerUrl from '../../workers/engine.worker?node-worker'`) is bundled here by esbuild,
// with everything it imports, into ONE self-contained `.mjs` emitted beside the server entry
// (`.output/server/workers/`, or `.nuxt/dev/workers/` in development). Making it a Rollup chunk
// instead pulls Nitro's runtime in and starts a whole server inside the worker thread.
// The import's default export is a function giving the file's URL: Nitro rewrites `import.meta.url`
// to the entry file's and fills it in only when the server runs, so the URL is computed when called.
// Types for the import: workers/node-worker.d.ts.

const MARKER = '?node-worker'
const PREFIX = '\0node-worker:'

/** Bundles a worker's entry file with everything it imports into one ES module: its code and the files it read. */
export async function bundleNodeWorker(entry: string): Promise<{ code: string; inputs: string[] }> {
  const out = await build({
    entryPoints: [entry],
    bundle: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    write: false,
    metafile: true,
    // Half the size: a new thread (at start, or after a run past its time limit) loads it faster.
    minify: true,
    keepNames: true,
    legalComments: 'none',
    logLevel: 'silent',
  })
  return { code: out.outputFiles[0]!.text, inputs: Object.keys(out.metafile.inputs).map((input) => resolve(input)) }
}

/** Rollup plugin for Nitro (`nitro.rollupConfig.plugins`) bundling `?node-worker` imports. */
export function nodeWorker(): Plugin {
  return {
    name: 'gillwatt-node-worker',
    async resolveId(source, importer) {
      if (!source.endsWith(MARKER)) return null
      const bare = source.slice(0, -MARKER.length)
      const found = await this.resolve(bare, importer, { skipSelf: true })
      const file = found?.id ?? resolve(importer ? dirname(importer) : process.cwd(), `${bare}.ts`)
      return PREFIX + file
    },
    async load(id) {
      if (!id.startsWith(PREFIX)) return null
      const entry = id.slice(PREFIX.length)
      const fileName = `workers/${basename(entry).replace(/\.[cm]?[jt]s$/, '')}.mjs`
      const { code, inputs } = await bundleNodeWorker(entry)
      // Rebuild in development when the worker or anything it imports changes.
      for (const input of inputs) this.addWatchFile(input)
      this.emitFile({ type: 'asset', fileName, source: code })
      return `export default function workerUrl() { return new URL(${JSON.stringify(fileName)}, globalThis._importMeta_.url).href }\n`
    },
  }
}
