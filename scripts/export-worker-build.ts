// Bundles the export worker (server/workers/export-worker.ts) into one file
// beside the server's entry. Nitro builds a single entry and has no notion of
// worker threads, so nuxt.config.ts calls this from Nitro's `compiled` hook;
// the bundle carries its own copies of the geometry, pdf-lib and dxf-writer
// and needs nothing from node_modules at run time.
import { fileURLToPath } from 'node:url'
import { build } from 'esbuild'

export async function bundleExportWorker(outfile: string): Promise<void> {
  await build({
    entryPoints: [fileURLToPath(new URL('../server/workers/export-worker.ts', import.meta.url))],
    outfile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    // paper.js looks for these only in a browser-like set-up; the geometry never asks for them.
    external: ['jsdom', 'canvas'],
    // CommonJS packages inside an ES module bundle still call require() for Node's own modules.
    banner: { js: 'import { createRequire as __rootplateRequire } from \'node:module\'; const require = __rootplateRequire(import.meta.url);' },
    logLevel: 'warning',
    legalComments: 'none',
  })
}
