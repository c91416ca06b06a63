import { join } from 'node:path'
import { build } from 'esbuild'
import { defineNuxtModule } from 'nuxt/kit'

// The analysis worker (server/workers/analyse-log.ts) runs in its own thread, so it must be a
// file of its own next to the built server rather than a chunk of Nitro's bundle. esbuild bundles
// it with the engine into one CommonJS file (papaparse is CommonJS; piscina is left to the
// server's own node_modules): after a production build into
// .output/server/workers/, found at run time beside the server's entry; in development into
// .nuxt/workers/, named through runtime config.
export const WORKER_FILE = 'analyse-log.cjs'

export default defineNuxtModule({
  meta: { name: 'analysis-worker' },
  setup(_options, nuxt) {
    const entry = join(nuxt.options.rootDir, 'server', 'workers', 'analyse-log.ts')
    const bundle = (outfile: string) => build({
      entryPoints: [entry],
      bundle: true,
      platform: 'node',
      format: 'cjs',
      target: 'node20',
      outfile,
      // The worker thread's piscina runtime and the worker must share one copy (see the worker).
      external: ['piscina'],
      logLevel: 'warning',
    })

    if (nuxt.options.dev) {
      const outfile = join(nuxt.options.buildDir, 'workers', WORKER_FILE)
      const analysis = nuxt.options.runtimeConfig.analysis as Record<string, unknown>
      analysis.workerPath = outfile
      nuxt.hook('nitro:build:before', async () => {
        await bundle(outfile)
      })
      return
    }
    nuxt.hook('nitro:init', (nitro) => {
      nitro.hooks.hook('compiled', async () => {
        await bundle(join(nitro.options.output.serverDir, 'workers', WORKER_FILE))
      })
    })
  },
})
