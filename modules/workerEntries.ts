/**
 * Ships worker-thread entries with the server. Nitro bundles server code into chunks
 * whose names it chooses, so a worker cannot be found by a path written in the source:
 * this module bundles each entry below on its own (esbuild; framework-free code only),
 * emits it as workers/<name>.mjs beside the server's index.mjs, and gives a virtual
 * module `#<virtual>` exporting a function that returns its URL. Works for `nuxt build`
 * and `nuxt dev` alike (the file is an asset).
 */
import { resolve } from 'node:path'
import { defineNuxtModule } from '@nuxt/kit'
import { build } from 'esbuild'
import type { Plugin } from 'rollup'

interface WorkerEntry {
  /** Virtual module id without '#', and the name of its exported URL function. */
  virtual: string
  exportName: string
  source: string
  fileName: string
}

const ENTRIES: WorkerEntry[] = [
  { virtual: 'engine-worker', exportName: 'engineWorkerUrl', source: 'server/workers/engineWorker.ts', fileName: 'workers/engineWorker.mjs' },
  { virtual: 'fit-worker', exportName: 'fitWorkerUrl', source: 'server/workers/fitWorker.ts', fileName: 'workers/fitWorker.mjs' },
]

function workerEntryPlugin(rootDir: string, entry: WorkerEntry): Plugin {
  const virtualId = `#${entry.virtual}`
  const resolvedId = `\0${entry.virtual}`
  const source = resolve(rootDir, entry.source)
  return {
    name: `slakewise-${entry.virtual}`,
    resolveId: (id) => (id === virtualId ? resolvedId : null),
    async load(id) {
      if (id !== resolvedId) return null
      const bundle = await build({
        entryPoints: [source],
        bundle: true,
        platform: 'node',
        format: 'esm',
        target: 'node20',
        write: false,
        metafile: true,
        logLevel: 'silent',
        // CommonJS dependencies bundled into an ES module still call require().
        banner: { js: `import { createRequire } from 'node:module'; const require = createRequire(import.meta.url);` },
      })
      for (const input of Object.keys(bundle.metafile.inputs)) this.addWatchFile(resolve(rootDir, input))
      const reference = this.emitFile({ type: 'asset', fileName: entry.fileName, source: bundle.outputFiles[0]!.text })
      return `export const ${entry.exportName} = () => import.meta.ROLLUP_FILE_URL_${reference}`
    },
    // Nitro rewrites every import.meta to the entry's, so the URL is written relative to
    // index.mjs at the root of the output folder; the entry sets that object only after
    // its imports have run: hence a function, called when a request needs the worker.
    resolveFileUrl: ({ fileName, moduleId }) => (moduleId === resolvedId ? `new URL(${JSON.stringify(`./${fileName}`)}, import.meta.url).href` : null),
  }
}

export default defineNuxtModule({
  meta: { name: 'slakewise-worker-entries' },
  setup(_options, nuxt) {
    nuxt.hook('nitro:config', (config) => {
      config.rollupConfig ??= {}
      const plugins = config.rollupConfig.plugins
      const existing = Array.isArray(plugins) ? plugins : plugins ? [plugins] : []
      config.rollupConfig.plugins = [...existing, ...ENTRIES.map((entry) => workerEntryPlugin(nuxt.options.rootDir, entry))]
    })
  },
})
