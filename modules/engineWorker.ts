/**
 * Ships the engine's worker-thread entry with the server. Nitro bundles server code
 * into chunks whose names it chooses, so the worker cannot be found by a path written
 * in the source: this module bundles server/workers/engineWorker.ts on its own
 * (esbuild, framework-free code only) and emits it as workers/engineWorker.mjs beside
 * the server's index.mjs; the virtual module `#engine-worker` exports a function giving its URL. Works for `nuxt build` and
 * `nuxt dev` alike (the file is an asset, so dev's single-file bundle keeps working).
 */
import { resolve } from 'node:path'
import { defineNuxtModule } from '@nuxt/kit'
import { build } from 'esbuild'
import type { Plugin } from 'rollup'

const VIRTUAL_ID = '#engine-worker'
const RESOLVED_ID = '\0engine-worker'

function engineWorkerPlugin(rootDir: string): Plugin {
  const entry = resolve(rootDir, 'server/workers/engineWorker.ts')
  return {
    name: 'slakewise-engine-worker',
    resolveId: (id) => (id === VIRTUAL_ID ? RESOLVED_ID : null),
    async load(id) {
      if (id !== RESOLVED_ID) return null
      const bundle = await build({
        entryPoints: [entry],
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
      const reference = this.emitFile({ type: 'asset', fileName: 'workers/engineWorker.mjs', source: bundle.outputFiles[0]!.text })
      return `export const engineWorkerUrl = () => import.meta.ROLLUP_FILE_URL_${reference}`
    },
    // Nitro rewrites every import.meta to the entry's (globalThis._importMeta_), so the
    // URL is written relative to index.mjs, which sits at the root of the output folder.
    // The entry sets that object only after its imports have run: hence a function,
    // called once the server has started.
    resolveFileUrl: ({ fileName, moduleId }) => (moduleId === RESOLVED_ID ? `new URL(${JSON.stringify(`./${fileName}`)}, import.meta.url).href` : null),
  }
}

export default defineNuxtModule({
  meta: { name: 'slakewise-engine-worker' },
  setup(_options, nuxt) {
    nuxt.hook('nitro:config', (config) => {
      config.rollupConfig ??= {}
      const plugins = config.rollupConfig.plugins
      config.rollupConfig.plugins = [...(Array.isArray(plugins) ? plugins : plugins ? [plugins] : []), engineWorkerPlugin(nuxt.options.rootDir)]
    })
  },
})
