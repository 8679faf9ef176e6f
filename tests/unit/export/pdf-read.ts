// Reads the drawing back out of a template PDF with pdf-lib and node:zlib
// (Flate, RFC 1950), independent of the writer: the plate drawing is one form
// XObject (/RpBody) in plate millimetres, placed on every sheet. Its stroked
// paths are collected with the stroke colour, width and dash in force
// (ISO 32000-1, 8.5 path construction: m, l, c, h, re; S strokes; RG, w, d set
// the stroke state).
import { inflateSync } from 'node:zlib'
import { PDFArray, PDFDocument, PDFName, PDFRawStream, PDFRef, type PDFDict, type PDFPage } from 'pdf-lib'

export type Pt = [number, number]

export interface StrokedPath {
  colour: string
  width: number
  dash: string
  /** Subpaths as polylines (curve end points only), with whether each was closed. */
  subpaths: { points: Pt[]; closed: boolean }[]
}

function inflate(stream: unknown): string {
  if (!(stream instanceof PDFRawStream)) throw new Error('not a raw stream')
  return inflateSync(Buffer.from(stream.contents)).toString('latin1')
}

/** The plate drawing's content stream, from the first content sheet that places it. */
export function bodyStream(doc: PDFDocument): string {
  for (const page of doc.getPages()) {
    const resources = page.node.Resources()
    const xobjects = resources?.lookup(PDFName.of('XObject'))
    if (!xobjects) continue
    const body = (xobjects as PDFDict).lookup(PDFName.of('RpBody'))
    if (body) return inflate(body)
  }
  throw new Error('no sheet places the drawing')
}

/** A page's own content streams, concatenated. */
export function pageStream(doc: PDFDocument, page: PDFPage): string {
  const contents = page.node.Contents()
  const refs = contents instanceof PDFArray ? contents.asArray() : contents ? [contents] : []
  return refs.map((r) => inflate(r instanceof PDFRef ? doc.context.lookup(r) : r)).join('\n')
}

/** Every stroked path of a content stream, with its stroke style. Text objects are skipped. */
export function strokedPaths(content: string): StrokedPath[] {
  const out: StrokedPath[] = []
  let colour = '0 0 0'
  let width = 1
  let dash = '[] 0'
  let subpaths: { points: Pt[]; closed: boolean }[] = []
  let current: { points: Pt[]; closed: boolean } | null = null
  const tokens = content.replace(/BT[\s\S]*?ET/g, ' ').match(/\[[^\]]*\]|\/?[^\s[\]]+/g) ?? []
  const operands: string[] = []
  for (const t of tokens) {
    if (/^[-+]?(\d+\.?\d*|\.\d+)$/.test(t) || t.startsWith('[') || t.startsWith('/')) {
      operands.push(t)
      continue
    }
    const nums = operands.map(Number)
    switch (t) {
      case 'RG':
        colour = operands.slice(-3).join(' ')
        break
      case 'w':
        width = nums.at(-1)!
        break
      case 'd':
        dash = `${operands.at(-2)} ${operands.at(-1)}`
        break
      case 'm':
        current = { points: [[nums.at(-2)!, nums.at(-1)!]], closed: false }
        subpaths.push(current)
        break
      case 'l':
        current?.points.push([nums.at(-2)!, nums.at(-1)!])
        break
      case 'c':
        current?.points.push([nums.at(-2)!, nums.at(-1)!])
        break
      case 'h':
        if (current) current.closed = true
        break
      case 're': {
        const [x, y, w, h] = nums.slice(-4) as [number, number, number, number]
        subpaths.push({ points: [[x, y], [x + w, y], [x + w, y + h], [x, y + h]], closed: true })
        current = null
        break
      }
      case 'S':
        out.push({ colour, width, dash, subpaths })
        subpaths = []
        current = null
        break
      case 'f':
      case 'B':
      case 'n':
        subpaths = []
        current = null
        break
    }
    operands.length = 0
  }
  return out
}
