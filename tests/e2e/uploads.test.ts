import { readdirSync, existsSync } from 'node:fs'
import { request } from 'node:http'
import { join } from 'node:path'
import { beforeAll, describe, expect, it, inject } from 'vitest'
import { fileTypeFromBuffer } from 'file-type'
import { api, demo, signIn, type DemoRole } from './support/api'
import { OTHER_LEAD } from './support/fixtures'
import { download, makePdf, makePng, upload } from './support/files'

// Attachments on a design (CONTRACTS.md: POST /api/designs/:id/attachments, multipart field
// `file` -> 201 { id, kind, url }; type from content; 415 other types; 413 over the limit).
const roles = Object.keys(demo) as DemoRole[]
const cookies = {} as Record<DemoRole, string>
let otherLead = ''
let designId = ''
const LIMIT = 15 * 1024 * 1024

// Magic numbers of the formats, from their specifications (independent of file-type):
// PNG signature 89 50 4E 47 0D 0A 1A 0A (ISO/IEC 15948, 5.2); JPEG SOI marker FF D8 (ITU-T T.81, B.1.1.3)
// followed by an APP0 marker FF E0; WebP: a RIFF container whose form type is "WEBP" (RFC 9649, 2.5);
// ELF executables start 7F 45 4C 46 (System V ABI, e_ident); Windows executables start "MZ".
const jpegBytes = Uint8Array.from([0xFF, 0xD8, 0xFF, 0xE0, 0x00, 0x10, 0x4A, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00, 0xFF, 0xD9])
const webpBytes = (() => {
  const b = new Uint8Array(40)
  b.set([...'RIFF'].map(c => c.charCodeAt(0)), 0)
  new DataView(b.buffer).setUint32(4, 32, true)
  b.set([...'WEBPVP8 '].map(c => c.charCodeAt(0)), 8)
  return b
})()
const elfBytes = Uint8Array.from([0x7F, 0x45, 0x4C, 0x46, 0x02, 0x01, 0x01, 0x00, ...new Array(56).fill(0)])
const pngBytes = makePng(64, 48, [{ x: 20, y: 20, r: 6 }])

function storedFiles(): string[] {
  const dir = inject('uploadsDir')
  const out: string[] = []
  const walk = (d: string) => {
    if (!existsSync(d)) return
    for (const e of readdirSync(d, { withFileTypes: true })) e.isDirectory() ? walk(join(d, e.name)) : out.push(join(d, e.name))
  }
  walk(dir)
  return out
}

/**
 * Streams a multipart body of `total` bytes in 1 MB pieces, stopping as soon as the
 * server answers; returns the status and how many bytes had been sent by then.
 */
/**
 * Starts a `total`-byte multipart body, sends at most `pauseAt` bytes of it and
 * then waits, the body unfinished, for the server's answer (rejecting after
 * `wait` ms without one): a server that waited for the whole body would never
 * answer. However fast the loopback takes the bytes, the outcome does not
 * depend on timing.
 */
function pushBody(path: string, cookie: string, total: number, announce: boolean, pauseAt: number, wait = 20_000): Promise<{ status: number; sent: number }> {
  const boundary = 'rootplate-test-boundary'
  const head = Buffer.from(`--${boundary}\r\ncontent-disposition: form-data; name="file"; filename="big.png"\r\ncontent-type: image/png\r\n\r\n`)
  return new Promise((resolve, reject) => {
    let sent = 0
    let answered = false
    const timer = setTimeout(() => {
      if (answered) return
      req.destroy()
      reject(new Error(`no answer within ${wait} ms with ${sent} of ${total} bytes sent and the body unfinished`))
    }, wait)
    const req = request(`${inject('baseUrl')}${path}`, {
      method: 'POST',
      headers: { cookie, 'content-type': `multipart/form-data; boundary=${boundary}`, ...(announce ? { 'content-length': String(total) } : {}) },
    }, (res) => {
      answered = true
      clearTimeout(timer)
      res.resume()
      res.on('end', () => resolve({ status: res.statusCode ?? 0, sent }))
      req.destroy()
    })
    req.on('error', (err) => {
      if (answered) return
      clearTimeout(timer)
      reject(err)
    })
    const piece = Buffer.alloc(1024 * 1024)
    const pump = () => {
      if (answered) return
      // Past the pause the body stays unfinished: only an answer (or the timer) ends the wait.
      if (sent >= pauseAt) return
      if (sent >= total) { req.end(); return }
      const chunk = sent === 0 ? Buffer.concat([head, piece.subarray(head.length)]) : piece
      sent += chunk.length
      if (req.write(chunk)) setImmediate(pump)
      else req.once('drain', pump)
    }
    pump()
  })
}

beforeAll(async () => {
  for (const r of roles) cookies[r] = await signIn(demo[r])
  otherLead = await signIn(OTHER_LEAD.email, OTHER_LEAD.password)
  const created = await api('/api/designs', { method: 'POST', cookie: cookies.lead, body: { name: 'Upload test stump', params: {} } })
  designId = created.body.id
})

describe('POST /api/designs/:id/attachments', () => {
  it('answers 401 without a session', async () => {
    expect((await upload(`/api/designs/${designId}/attachments`, pngBytes, 'a.png')).status).toBe(401)
  })

  it.each(['lead', 'designer'] as DemoRole[])('a %s attaches a PNG: 201 { id, kind, url }, read back byte-identical by every role', async (role) => {
    const res = await upload(`/api/designs/${designId}/attachments`, pngBytes, `sketch-by-${role}.png`, { cookie: cookies[role] })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ kind: 'image', contentType: 'image/png', size: pngBytes.byteLength, name: `sketch-by-${role}.png` })
    expect(res.body.id).toMatch(/^[0-9a-f-]{36}$/)
    for (const r of roles) {
      const got = await download(res.body.url, cookies[r])
      expect(got.status).toBe(200)
      expect(got.type).toBe('image/png')
      expect(Buffer.from(got.bytes).equals(Buffer.from(pngBytes))).toBe(true)
    }
    const list = await api(`/api/designs/${designId}/attachments`, { cookie: cookies.viewer })
    expect(list.status).toBe(200)
    expect(list.body.map((a: { id: string }) => a.id)).toContain(res.body.id)
  })

  it.each(['builder', 'viewer'] as DemoRole[])('a %s may not attach (403) and nothing is stored', async (role) => {
    const before = storedFiles().length
    const res = await upload(`/api/designs/${designId}/attachments`, pngBytes, 'no.png', { cookie: cookies[role] })
    expect(res.status).toBe(403)
    expect(storedFiles().length).toBe(before)
  })

  it('a PDF and a JPEG and a WebP are taken, each kind read from its bytes', async () => {
    const pdf = await makePdf()
    const a = await upload(`/api/designs/${designId}/attachments`, pdf, 'drawing.pdf', { cookie: cookies.designer })
    expect(a.status).toBe(201)
    expect(a.body.kind).toBe('pdf')
    const j = await upload(`/api/designs/${designId}/attachments`, jpegBytes, 'photo.jpg', { cookie: cookies.designer })
    expect(j.status).toBe(201)
    expect(j.body.contentType).toBe('image/jpeg')
    const w = await upload(`/api/designs/${designId}/attachments`, webpBytes, 'photo.webp', { cookie: cookies.designer })
    expect(w.status).toBe(201)
    expect(w.body.contentType).toBe('image/webp')
  })

  it('a PNG named .pdf and sent as application/pdf is kept as a PNG', async () => {
    const res = await upload(`/api/designs/${designId}/attachments`, pngBytes, 'plan.pdf', { cookie: cookies.designer, type: 'application/pdf' })
    expect(res.status).toBe(201)
    expect(res.body.kind).toBe('image')
    const got = await download(res.body.url, cookies.viewer)
    expect(got.type).toBe('image/png')
    // An independent reading of the stored bytes agrees.
    expect((await fileTypeFromBuffer(got.bytes))?.mime).toBe('image/png')
  })

  it.each([
    ['an ELF executable named .png', elfBytes, 'tree.png'],
    ['a Windows executable named .png', Uint8Array.from([0x4D, 0x5A, 0x90, 0x00, 0x03, ...new Array(300).fill(0)]), 'rock.png'],
    ['a text file named .png', new TextEncoder().encode('just some notes about the oak\n'), 'notes.png'],
  ])('%s is refused with 415 and nothing is stored', async (_, bytes, name) => {
    const before = storedFiles().length
    const listBefore = (await api(`/api/designs/${designId}/attachments`, { cookie: cookies.lead })).body.length
    const res = await upload(`/api/designs/${designId}/attachments`, bytes, name, { cookie: cookies.designer, type: 'image/png' })
    expect(res.status).toBe(415)
    expect(res.body.message).toMatch(/PNG, JPEG or WebP image, or a PDF/)
    expect(storedFiles().length).toBe(before)
    expect((await api(`/api/designs/${designId}/attachments`, { cookie: cookies.lead })).body.length).toBe(listBefore)
  })

  it('a file one byte over 15 MB is refused with 413, a clear message, and nothing stored', async () => {
    const before = storedFiles().length
    const big = new Uint8Array(LIMIT + 1)
    big.set(pngBytes)
    const res = await upload(`/api/designs/${designId}/attachments`, big, 'huge.png', { cookie: cookies.designer })
    expect(res.status).toBe(413)
    expect(res.body.message).toMatch(/at most 15 MB/)
    expect(storedFiles().length).toBe(before)
  })

  it.each([
    ['announced by its length', true],
    ['sent in chunks without a length', false],
  ])('a 40 MB body %s is refused with 413 before it has all arrived, and the server carries on', async (_, announce) => {
    const before = storedFiles().length
    // 20 MB of the 40 are sent (5 MB past the limit), then the client waits with the body unfinished.
    const { status, sent } = await pushBody(`/api/designs/${designId}/attachments`, cookies.designer, 40 * 1024 * 1024, announce, 20 * 1024 * 1024)
    expect(status).toBe(413)
    // So the answer came while half the body was still unsent.
    expect(sent).toBeLessThanOrEqual(21 * 1024 * 1024)
    expect(storedFiles().length).toBe(before)
    expect((await api('/api/designs', { cookie: cookies.viewer })).status).toBe(200)
  })

  it('a file of exactly 15 MB is taken', async () => {
    const exact = new Uint8Array(LIMIT)
    exact.set(pngBytes)
    const res = await upload(`/api/designs/${designId}/attachments`, exact, 'limit.png', { cookie: cookies.designer })
    expect(res.status).toBe(201)
    expect(res.body.size).toBe(LIMIT)
    expect((await api(`/api/attachments/${res.body.id}`, { method: 'DELETE', cookie: cookies.designer })).status).toBe(204)
  })

  it('a request without a file, or not multipart, is refused with a message', async () => {
    const form = new FormData()
    form.append('other', 'x')
    const res = await fetch(`${inject('baseUrl')}/api/designs/${designId}/attachments`, { method: 'POST', body: form, headers: { cookie: cookies.designer } })
    expect(res.status).toBe(422)
    expect((await res.json()).data.fields.file).toMatch(/Choose a file/)
    const json = await api(`/api/designs/${designId}/attachments`, { method: 'POST', cookie: cookies.designer, body: { file: 'x' } })
    expect(json.status).toBe(415)
  })
})

describe('files across shops', () => {
  it('another shop\'s design and files answer 404, and its lead cannot attach to ours', async () => {
    const mine = await upload(`/api/designs/${designId}/attachments`, pngBytes, 'ours.png', { cookie: cookies.lead })
    expect(mine.status).toBe(201)
    expect((await download(mine.body.url, otherLead)).status).toBe(404)
    expect((await api(`/api/attachments/${mine.body.id}`, { method: 'DELETE', cookie: otherLead })).status).toBe(404)
    expect((await api(`/api/designs/${designId}/attachments`, { cookie: otherLead })).status).toBe(404)
    expect((await upload(`/api/designs/${designId}/attachments`, pngBytes, 'theirs.png', { cookie: otherLead })).status).toBe(404)
    const other = inject('other')
    for (const r of roles) {
      expect((await api(`/api/designs/${other.designId}/attachments`, { cookie: cookies[r] })).status).toBe(404)
    }
    expect((await upload(`/api/designs/${other.designId}/attachments`, pngBytes, 'x.png', { cookie: cookies.lead })).status).toBe(404)
    // Still there for our shop.
    expect((await download(mine.body.url, cookies.viewer)).status).toBe(200)
  })
})

describe('DELETE /api/attachments/:id', () => {
  it('builders and viewers may not remove (403); a designer removes it (204) and its bytes are gone', async () => {
    const res = await upload(`/api/designs/${designId}/attachments`, pngBytes, 'to-remove.png', { cookie: cookies.designer })
    const before = storedFiles().length
    for (const r of ['builder', 'viewer'] as DemoRole[]) {
      expect((await api(`/api/attachments/${res.body.id}`, { method: 'DELETE', cookie: cookies[r] })).status).toBe(403)
    }
    expect((await api(`/api/attachments/${res.body.id}`, { method: 'DELETE', cookie: cookies.designer })).status).toBe(204)
    expect((await download(res.body.url, cookies.lead)).status).toBe(404)
    expect(storedFiles().length).toBe(before - 1)
    expect((await api(`/api/attachments/${res.body.id}`, { method: 'DELETE', cookie: cookies.lead })).status).toBe(404)
  })
})

describe('the reference image of a design', () => {
  it('is placed by an editor, read by every role, refused for builders, and kept out of revisions and exports', async () => {
    const img = await upload(`/api/designs/${designId}/attachments`, pngBytes, 'photo.png', { cookie: cookies.designer })
    const pdf = await upload(`/api/designs/${designId}/attachments`, await makePdf(), 'sheet.pdf', { cookie: cookies.designer })
    const detail = await api(`/api/designs/${designId}`, { cookie: cookies.lead })
    const place = { attachmentId: img.body.id, x: 12.5, y: -30, rotation: 15, mmPerPixel: 2.54, opacity: 0.4 }
    expect((await api(`/api/designs/${designId}/reference`, { method: 'PUT', cookie: cookies.builder, body: place })).status).toBe(403)
    const put = await api(`/api/designs/${designId}/reference`, { method: 'PUT', cookie: cookies.designer, body: place })
    expect(put.status).toBe(200)
    for (const r of roles) {
      const got = await api(`/api/designs/${designId}/reference`, { cookie: cookies[r] })
      expect(got.body).toMatchObject({ ...place, url: img.body.url })
    }
    // Saved with the design: no new revision, and the stored params do not mention it.
    const after = await api(`/api/designs/${designId}`, { cookie: cookies.lead })
    expect(after.body.latest.number).toBe(detail.body.latest.number)
    expect(JSON.stringify(after.body.latest.params)).not.toContain(img.body.id)
    const dxf = await api(`/api/revisions/${after.body.latest.id}/cut.dxf?units=mm`, { cookie: cookies.lead })
    expect(dxf.status).toBe(200)
    expect(String(dxf.body)).not.toMatch(/IMAGE|IMAGEDEF/)

    const bad = await api(`/api/designs/${designId}/reference`, { method: 'PUT', cookie: cookies.designer, body: { ...place, attachmentId: pdf.body.id, mmPerPixel: 0, opacity: 3 } })
    expect(bad.status).toBe(422)
    expect(Object.keys(bad.body.data.fields)).toEqual(expect.arrayContaining(['mmPerPixel', 'opacity']))
    const pdfRef = await api(`/api/designs/${designId}/reference`, { method: 'PUT', cookie: cookies.designer, body: { ...place, attachmentId: pdf.body.id } })
    expect(pdfRef.status).toBe(422)
    expect(pdfRef.body.data.fields.attachmentId).toBeTruthy()
    expect((await api(`/api/designs/${designId}/reference`, { cookie: otherLead })).status).toBe(404)
    expect((await api(`/api/designs/${designId}/reference`, { method: 'PUT', cookie: otherLead, body: place })).status).toBe(404)

    // Removing the image file takes it off the canvas too.
    expect((await api(`/api/attachments/${img.body.id}`, { method: 'DELETE', cookie: cookies.lead })).status).toBe(204)
    expect((await api(`/api/designs/${designId}/reference`, { cookie: cookies.viewer })).body).toBeNull()
  })
})
