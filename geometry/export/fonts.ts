// The template's typeface. Callers hand over the font file's bytes (the
// browser fetches them, the server reads them from disk); only when none are
// given does the writer fall back to the server-side loader.

/**
 * The WOFF file shipped with `@fontsource/ibm-plex-sans`. Embedded as a subset:
 * fontkit then writes plain TrueType tables, where a full embed would copy the
 * compressed WOFF container that PDF readers reject. (WOFF2 subsetting crashed
 * on some strings, hence WOFF.)
 */
export const TEMPLATE_FONT_FILE = '@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff'

export type FontBytes = Uint8Array

/** Bytes given, or read on the server; in a browser the caller must pass them. */
export async function resolveFontBytes(given?: FontBytes): Promise<FontBytes> {
  if (given) return given
  const runtime = (globalThis as { process?: { versions?: { node?: unknown } } }).process
  const isNode = typeof runtime?.versions?.node === 'string'
  if (!isNode) {
    throw new Error('In the browser pass the template font bytes (options.font); only the server reads them itself.')
  }
  const { loadTemplateFontNode } = await import('./fonts-node')
  return loadTemplateFontNode()
}
