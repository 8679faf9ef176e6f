// The template's typeface. Callers hand over the font file's bytes (the
// browser fetches them, the server reads them from disk); only when none are
// given does the writer read them itself, under Node only.

/**
 * The WOFF file shipped with `@fontsource/ibm-plex-sans`. Embedded as a subset:
 * fontkit then writes plain TrueType tables, where a full embed would copy the
 * compressed WOFF container that PDF readers reject. (WOFF2 subsetting crashed
 * on some strings, hence WOFF.)
 */
export const TEMPLATE_FONT_FILE = '@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff'

export type FontBytes = Uint8Array

/**
 * Bytes given, or read from node_modules when running under Node. Node's
 * modules are reached through `process.getBuiltinModule` (Node 20.16+) rather
 * than an import, so browser bundles of this library carry no Node code.
 */
export async function resolveFontBytes(given?: FontBytes): Promise<FontBytes> {
  if (given) return given
  type NodeProcess = { getBuiltinModule?: (id: string) => unknown; cwd: () => string }
  const runtime = (globalThis as { process?: NodeProcess }).process
  if (!runtime?.getBuiltinModule) {
    throw new Error('Pass the template font bytes (options.font); only Node can read them itself.')
  }
  const { readFile } = runtime.getBuiltinModule('node:fs/promises') as { readFile: (path: string) => Promise<Uint8Array> }
  const { createRequire } = runtime.getBuiltinModule('node:module') as { createRequire: (from: string) => { resolve: (id: string) => string } }
  const file = createRequire(`${runtime.cwd()}/package.json`).resolve(TEMPLATE_FONT_FILE)
  const bytes = await readFile(file)
  return new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength)
}

const sfntCache = new WeakMap<FontBytes, Promise<FontBytes>>()

async function inflate(data: Uint8Array): Promise<Uint8Array> {
  // Compression Streams: in every current browser and in Node 18+; 'deflate' is the zlib format WOFF uses.
  const stream = new Blob([data as Uint8Array<ArrayBuffer>]).stream().pipeThrough(new DecompressionStream('deflate'))
  return new Uint8Array(await new Response(stream).arrayBuffer())
}

/**
 * A WOFF 1.0 file (W3C Recommendation, 2012) unpacked into the plain
 * TrueType/OpenType file it wraps; other bytes are returned as they are.
 * fontkit reads WOFF itself, but inflates the whole glyph table again for
 * every glyph it subsets, which cost most of a template's time.
 */
export function unpackWoff(bytes: FontBytes): Promise<FontBytes> {
  const cached = sfntCache.get(bytes)
  if (cached) return cached
  const result = unpack(bytes)
  sfntCache.set(bytes, result)
  return result
}

async function unpack(bytes: FontBytes): Promise<FontBytes> {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  if (bytes.byteLength < 44 || view.getUint32(0) !== 0x774f4646) return bytes
  const flavor = view.getUint32(4)
  const numTables = view.getUint16(12)
  const tables: { tag: number; checksum: number; data: Uint8Array }[] = []
  for (let i = 0; i < numTables; i++) {
    const at = 44 + i * 20
    const tag = view.getUint32(at)
    const offset = view.getUint32(at + 4)
    const compLength = view.getUint32(at + 8)
    const origLength = view.getUint32(at + 12)
    const checksum = view.getUint32(at + 16)
    const raw = bytes.subarray(offset, offset + compLength)
    const data = compLength < origLength ? await inflate(raw) : raw
    if (data.byteLength !== origLength) throw new Error('Damaged WOFF font: a table has the wrong length.')
    tables.push({ tag, checksum, data })
  }
  tables.sort((a, b) => a.tag - b.tag)
  const headerLength = 12 + 16 * numTables
  const total = tables.reduce((n, t) => n + ((t.data.byteLength + 3) & ~3), headerLength)
  const out = new Uint8Array(total)
  const ov = new DataView(out.buffer)
  let pow = 1
  while (pow * 2 <= numTables) pow *= 2
  ov.setUint32(0, flavor)
  ov.setUint16(4, numTables)
  ov.setUint16(6, pow * 16)
  ov.setUint16(8, Math.log2(pow))
  ov.setUint16(10, numTables * 16 - pow * 16)
  let offset = headerLength
  tables.forEach((t, i) => {
    const rec = 12 + i * 16
    ov.setUint32(rec, t.tag)
    ov.setUint32(rec + 4, t.checksum)
    ov.setUint32(rec + 8, offset)
    ov.setUint32(rec + 12, t.data.byteLength)
    out.set(t.data, offset)
    offset += (t.data.byteLength + 3) & ~3
  })
  return out
}
