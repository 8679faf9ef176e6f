/// <reference types="node" />
// Server side only: reads the template font from node_modules. Kept apart so
// everything else in geometry/ runs in a browser.

import { readFile } from 'node:fs/promises'
import { createRequire } from 'node:module'
import { join } from 'node:path'
import { TEMPLATE_FONT_FILE, type FontBytes } from './fonts'

let cached: Promise<FontBytes> | null = null

function locate(): string {
  // A bundled server may sit outside the package tree; the working directory is the project's root.
  const bases = [import.meta.url, join(process.cwd(), 'package.json')]
  const errors: string[] = []
  for (const base of bases) {
    try {
      return createRequire(base).resolve(TEMPLATE_FONT_FILE)
    } catch (error: unknown) {
      errors.push(error instanceof Error ? error.message : String(error))
    }
  }
  throw new Error(`Template font not found (${TEMPLATE_FONT_FILE}): ${errors.join('; ')}`)
}

export function loadTemplateFontNode(): Promise<FontBytes> {
  cached ??= readFile(locate()).then((b) => new Uint8Array(b.buffer, b.byteOffset, b.byteLength))
  cached.catch(() => {
    cached = null
  })
  return cached
}
