// The four export routes against the built server: who may download, what a
// bad option answers, and the files read back with independent readers
// (pdf-lib, dxf-parser, poppler's pdftoppm).
import { execFileSync } from 'node:child_process'
import { mkdirSync, statSync, writeFileSync } from 'node:fs'
import DxfParser, { type IDxf, type ILwpolylineEntity } from 'dxf-parser'
import { PDFDocument } from 'pdf-lib'
import { beforeAll, describe, expect, it, inject } from 'vitest'
import { buildPlate, plateParamsSchema, type Plate } from '../../geometry'
import { tilePlate } from '../../geometry/export/tiling'
import { offsetPolygon } from '../../geometry/export/polyline'
import { LAYER_OUTSIDE } from '../../geometry/export/cut-layers'
import { api, demo, freshAddress, signIn, type DemoRole } from './support/api'

const roles = Object.keys(demo) as DemoRole[]
const cookies = {} as Record<DemoRole, string>
const IN = 25.4 // mm per inch, exact (international yard and pound agreement 1959; NIST SP 811)
const PT_PER_MM = 72 / IN // PDF user space unit is 1/72 in (ISO 32000-1, 8.3.2.3)
const shots = 'test-results/e2e'

let revisionId = ''
let revisionNumber = 0
let plate: Plate

interface BinaryReply { status: number; type: string; disposition: string; bytes: Uint8Array; text: string }

/** `api()` reads text, which would mangle a PDF: this one keeps the bytes. */
async function download(path: string, cookie?: string): Promise<BinaryReply> {
  const headers: Record<string, string> = { 'x-forwarded-for': freshAddress() }
  if (cookie) headers.cookie = cookie
  const res = await fetch(`${inject('baseUrl')}${path}`, { headers, redirect: 'manual' })
  const bytes = new Uint8Array(await res.arrayBuffer())
  return {
    status: res.status,
    type: res.headers.get('content-type') ?? '',
    disposition: res.headers.get('content-disposition') ?? '',
    bytes,
    text: new TextDecoder().decode(bytes),
  }
}

function fileNameOf(disposition: string): string | null {
  return /filename="([^"]+)"/.exec(disposition)?.[1] ?? null
}

const routes = [
  { file: 'template.pdf', query: 'paper=letter', type: 'application/pdf', ext: '.pdf' },
  { file: 'tube-wrap.pdf', query: 'paper=letter', type: 'application/pdf', ext: '-tube-wrap.pdf' },
  { file: 'cut.dxf', query: 'units=in', type: 'application/dxf', ext: '.dxf' },
  { file: 'cut.svg', query: 'units=mm', type: 'image/svg+xml', ext: '.svg' },
] as const

beforeAll(async () => {
  for (const r of roles) cookies[r] = await signIn(demo[r])
  const list = await api('/api/designs', { cookie: cookies.builder })
  const oak = list.body.find((d: { name: string }) => d.name === 'Hollow oak')
  const detail = await api(`/api/designs/${oak.id}`, { cookie: cookies.builder })
  revisionId = detail.body.latest.id
  revisionNumber = detail.body.latest.number
  // The same plate the server rebuilds from the stored params, to compare the files with.
  plate = buildPlate(plateParamsSchema.parse(detail.body.latest.params))
  mkdirSync(shots, { recursive: true })
})

describe('who may download', () => {
  describe.each(roles)('a %s', (role) => {
    it.each(routes)('gets $file with its content type and a name made from design, size and revision', async ({ file, query, type, ext }) => {
      const res = await download(`/api/revisions/${revisionId}/${file}?${query}`, cookies[role])
      expect(res.status).toBe(200)
      expect(res.type).toContain(type)
      expect(res.disposition).toMatch(/^attachment;/)
      // Seeded as "Hollow oak", size "Medium · 16 in tube": the size's "16 in" reads as one word.
      expect(fileNameOf(res.disposition)).toBe(`hollow-oak-medium-16in-tube-r${revisionNumber}${ext}`)
      expect(res.bytes.length).toBeGreaterThan(500)
    })
  })

  it.each(routes)('$file without a session is a 401', async ({ file, query }) => {
    const res = await download(`/api/revisions/${revisionId}/${file}?${query}`)
    expect(res.status).toBe(401)
  })

  it.each(routes)('$file of another shop\'s revision is a 404 that names nothing of it', async ({ file, query }) => {
    const res = await download(`/api/revisions/${inject('other').revisionId}/${file}?${query}`, cookies.lead)
    expect(res.status).toBe(404)
    expect(res.text).not.toContain('Harbour')
  })
})

describe('bad options are a 422 with field messages', () => {
  it.each([
    ['template.pdf', 'paper=b5', 'paper', /Paper must be one of/],
    ['tube-wrap.pdf', 'paper=b5', 'paper', /Paper must be one of/],
    ['template.pdf', 'units=ft', 'units', /in or mm/],
    ['cut.dxf', 'units=ft', 'units', /in or mm/],
    ['cut.svg', 'units=ft', 'units', /in or mm/],
    ['template.pdf', 'bushing=15.875', 'bit', /both the bushing and the bit/],
    ['template.pdf', 'bushing=6&bit=12', 'bushing', /wider than the bit/],
  ])('%s?%s names the %s field', async (file, query, field, message) => {
    const res = await api(`/api/revisions/${revisionId}/${file}?${query}`, { cookie: cookies.viewer })
    expect(res.status).toBe(422)
    expect(res.body.data.fields[field]).toMatch(message)
  })
})

describe('the template PDF read back with pdf-lib', () => {
  function pageSizes(doc: PDFDocument): [number, number][] {
    return doc.getPages().map(p => [p.getWidth(), p.getHeight()])
  }
  /** Short side first, so one size check covers portrait and landscape. */
  function sorted([w, h]: [number, number]): [number, number] {
    return w < h ? [w, h] : [h, w]
  }

  it('prints Letter pages, 612x792 pt in either orientation (ASME Y14.1 size A), one per printed sheet and a cover', async () => {
    const res = await download(`/api/revisions/${revisionId}/template.pdf?paper=letter&units=in`, cookies.builder)
    expect(res.status).toBe(200)
    const doc = await PDFDocument.load(res.bytes)
    for (const size of pageSizes(doc)) {
      const [w, h] = sorted(size)
      expect(w).toBeCloseTo(612, 2)
      expect(h).toBeCloseTo(792, 2)
    }
    const tiling = tilePlate(plate, { paper: 'letter' })
    expect(tiling.printed).toBeGreaterThan(1)
    expect(doc.getPageCount()).toBe(tiling.printed + 1)
    writeFileSync(`${shots}/exports-template-letter.pdf`, res.bytes)
  })

  it('prints A4 pages, 595.28x841.89 pt (ISO 216: 210x297 mm)', async () => {
    const res = await download(`/api/revisions/${revisionId}/template.pdf?paper=a4&orientation=portrait`, cookies.viewer)
    const doc = await PDFDocument.load(res.bytes)
    expect(doc.getPageCount()).toBe(tilePlate(plate, { paper: 'a4', orientation: 'portrait' }).printed + 1)
    for (const [w, h] of pageSizes(doc)) {
      expect(w).toBeCloseTo(595.28, 1)
      expect(h).toBeCloseTo(841.89, 1)
    }
  })

  it('honours a forced landscape orientation and the margin and overlap asked for', async () => {
    // 20 mm margin and 25 mm overlap leave a smaller step, so more sheets than the defaults.
    const res = await download(`/api/revisions/${revisionId}/template.pdf?paper=letter&orientation=landscape&margin=20&overlap=25`, cookies.designer)
    const doc = await PDFDocument.load(res.bytes)
    const sheets = pageSizes(doc).slice(1)
    for (const [w, h] of sheets) {
      expect(w).toBeCloseTo(792, 2)
      expect(h).toBeCloseTo(612, 2)
    }
    const asked = tilePlate(plate, { paper: 'letter', orientation: 'landscape', margin: 20, overlap: 25 })
    const defaults = tilePlate(plate, { paper: 'letter', orientation: 'landscape' })
    expect(asked.printed).toBeGreaterThan(defaults.printed)
    expect(sheets).toHaveLength(asked.printed)
  })

  it('a roll page is as wide as the roll: 24 in = 1728 pt, no longer than 14,400 pt (ISO 32000-1, Annex C)', async () => {
    const res = await download(`/api/revisions/${revisionId}/template.pdf?paper=roll-24in&orientation=portrait`, cookies.builder)
    const doc = await PDFDocument.load(res.bytes)
    for (const [w, h] of pageSizes(doc)) {
      expect(w).toBeCloseTo(24 * 72, 2)
      expect(h).toBeLessThanOrEqual(14_400)
    }
  })

  it('with a guide bushing the pattern line lies inside the cut line, so the sheets are those of the outline', async () => {
    // A 60 mm bushing and a 1/4 in bit: offset (60 - 6.35) / 2 = 26.825 mm. The bushing rides the
    // pattern and the bit cuts that far beyond it, so an outside pattern is smaller than the plate
    // (router pattern practice, common practice).
    const res = await download(`/api/revisions/${revisionId}/template.pdf?paper=letter&bushing=60&bit=6.35`, cookies.builder)
    expect(res.status).toBe(200)
    const doc = await PDFDocument.load(res.bytes)
    const inset = offsetPolygon(plate.outline, -26.825)
    expect(Math.max(...inset.map(([x]) => x))).toBeLessThan(Math.max(...plate.outline.map(([x]) => x)) - 26)
    expect(doc.getPageCount()).toBe(tilePlate(plate, { paper: 'letter' }).printed + 1)
  })

  it('the tube wrap on A3 has A3 pages, 841.89x1190.55 pt (ISO 216: 297x420 mm)', async () => {
    const res = await download(`/api/revisions/${revisionId}/tube-wrap.pdf?paper=a3`, cookies.builder)
    expect(res.status).toBe(200)
    const doc = await PDFDocument.load(res.bytes)
    expect(doc.getPageCount()).toBeGreaterThanOrEqual(2)
    for (const size of pageSizes(doc)) {
      const [w, h] = sorted(size)
      expect(w).toBeCloseTo(297 * PT_PER_MM, 1)
      expect(h).toBeCloseTo(420 * PT_PER_MM, 1)
    }
  })
})

describe('the picture check', () => {
  it('pdftoppm (poppler) renders the cover and a content sheet of the template to PNG', async () => {
    const res = await download(`/api/revisions/${revisionId}/template.pdf?paper=letter&units=in`, cookies.builder)
    const pdf = `${shots}/exports-picture.pdf`
    writeFileSync(pdf, res.bytes)
    const doc = await PDFDocument.load(res.bytes)
    // The cover is page 1; the content sheet holding the plate centre shows the trunk circle, pockets and labels.
    const tiling = tilePlate(plate, { paper: 'letter' })
    const printed = tiling.sheets.filter(s => !s.empty)
    const centre = printed.findIndex(s => s.window.minX <= 0 && s.window.maxX >= 0 && s.window.minY <= 0 && s.window.maxY >= 0)
    expect(centre).toBeGreaterThanOrEqual(0)
    const contentPage = centre + 2
    expect(contentPage).toBeLessThanOrEqual(doc.getPageCount())
    for (const [page, name] of [[1, 'template-cover'], [contentPage, 'template-sheet']] as const) {
      execFileSync('/usr/bin/pdftoppm', ['-png', '-r', '60', '-f', String(page), '-l', String(page), '-singlefile', pdf, `${shots}/${name}`])
      const png = `${shots}/${name}.png`
      // 60 dpi of a Letter page: 510x660 px (or turned), so a real picture is well above a few kB.
      expect(statSync(png).size).toBeGreaterThan(10_000)
    }
  })
})

describe('the cut files read back', () => {
  function parse(text: string): IDxf {
    const dxf = new DxfParser().parseSync(text)
    if (!dxf) throw new Error('dxf-parser read nothing')
    return dxf
  }
  function outline(dxf: IDxf): ILwpolylineEntity {
    const found = dxf.entities.filter(e => e.layer === LAYER_OUTSIDE && e.type === 'LWPOLYLINE') as ILwpolylineEntity[]
    expect(found).toHaveLength(1)
    return found[0]!
  }
  function width(e: ILwpolylineEntity): number {
    const xs = e.vertices.map(v => v.x)
    return Math.max(...xs) - Math.min(...xs)
  }

  it('units=in: $INSUNITS 1 (DXF Reference, HEADER), a closed outline as wide as the plate in inches', async () => {
    const res = await download(`/api/revisions/${revisionId}/cut.dxf?units=in`, cookies.builder)
    const dxf = parse(res.text)
    expect(dxf.header.$INSUNITS).toBe(1)
    const o = outline(dxf)
    expect(o.shape).toBe(true) // LWPOLYLINE flag 1 = closed (DXF Reference, ENTITIES)
    // The outline is written within a 0.1 mm chord error (CONTRACTS.md), so its extent matches to a fraction of a mm.
    expect(width(o)).toBeCloseTo(plate.metrics.width / IN, 2)
  })

  it('units=mm: $INSUNITS 4 (DXF Reference, HEADER), the same outline in millimetres', async () => {
    const res = await download(`/api/revisions/${revisionId}/cut.dxf?units=mm`, cookies.builder)
    const dxf = parse(res.text)
    expect(dxf.header.$INSUNITS).toBe(4)
    const o = outline(dxf)
    expect(o.shape).toBe(true)
    expect(width(o)).toBeGreaterThan(plate.metrics.width - 0.2)
    expect(width(o)).toBeLessThan(plate.metrics.width + 0.2)
  })

  it('reference=false leaves the reference layer out; mirror=true flips x', async () => {
    const full = parse((await download(`/api/revisions/${revisionId}/cut.dxf?units=mm`, cookies.builder)).text)
    const bare = parse((await download(`/api/revisions/${revisionId}/cut.dxf?units=mm&reference=false`, cookies.builder)).text)
    const onReference = (d: IDxf) => d.entities.filter(e => e.layer === 'RP-REFERENCE').length
    expect(onReference(full)).toBeGreaterThan(0)
    expect(onReference(bare)).toBe(0)
    const mirrored = parse((await download(`/api/revisions/${revisionId}/cut.dxf?units=mm&mirror=true`, cookies.builder)).text)
    const xs = (d: IDxf) => outline(d).vertices.map(v => v.x)
    expect(Math.max(...xs(mirrored))).toBeCloseTo(-Math.min(...xs(full)), 3)
  })

  it.each([['in', IN], ['mm', 1]] as const)('the SVG is at real size: width and height in %s', async (units, mmPerUnit) => {
    const res = await download(`/api/revisions/${revisionId}/cut.svg?units=${units}`, cookies.builder)
    const m = /<svg[^>]*\swidth="([\d.]+)(in|mm)"[^>]*\sheight="([\d.]+)(in|mm)"/.exec(res.text)
    expect(m).not.toBeNull()
    expect(m![2]).toBe(units)
    expect(m![4]).toBe(units)
    // The drawing covers at least the plate's outline.
    expect(Number(m![1]) * mmPerUnit).toBeGreaterThanOrEqual(plate.metrics.width - 0.2)
    expect(Number(m![3]) * mmPerUnit).toBeGreaterThanOrEqual(plate.metrics.height - 0.2)
  })
})
