import { inject } from 'vitest'
import { PNG } from 'pngjs'
import { PDFDocument } from 'pdf-lib'

/** A real PNG drawn by pngjs (an independent encoder): white, with optional black dots. */
export function makePng(width: number, height: number, dots: { x: number; y: number; r: number }[] = []): Uint8Array {
  const png = new PNG({ width, height })
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 4
      const dark = dots.some(d => (x - d.x) ** 2 + (y - d.y) ** 2 <= d.r ** 2)
      png.data[i] = dark ? 200 : 250
      png.data[i + 1] = dark ? 30 : 248
      png.data[i + 2] = dark ? 30 : 240
      png.data[i + 3] = 255
    }
  }
  return new Uint8Array(PNG.sync.write(png))
}

/** A one-page PDF written by pdf-lib. */
export async function makePdf(): Promise<Uint8Array> {
  const doc = await PDFDocument.create()
  doc.addPage([612, 792]).drawText('Set sketch, act 2')
  return doc.save()
}

/** POSTs one file as multipart (field `file`), as a browser form would. */
export async function upload(path: string, bytes: Uint8Array, name: string, opts: { cookie?: string; type?: string; base?: string } = {}) {
  const form = new FormData()
  form.append('file', new Blob([bytes as Uint8Array<ArrayBuffer>], { type: opts.type ?? 'application/octet-stream' }), name)
  const res = await fetch(`${opts.base ?? inject('baseUrl')}${path}`, { method: 'POST', body: form, headers: opts.cookie ? { cookie: opts.cookie } : {} })
  const text = await res.text()
  let body: any = text
  try { body = JSON.parse(text) }
  catch { /* keep the text */ }
  return { status: res.status, body }
}

export async function download(path: string, cookie: string, base = inject('baseUrl')) {
  const res = await fetch(`${base}${path}`, { headers: { cookie } })
  return { status: res.status, type: res.headers.get('content-type'), bytes: new Uint8Array(await res.arrayBuffer()) }
}
