// The template read back with pdf-lib (PDFDocument.load) and its content
// streams inflated with node:zlib (Flate, RFC 1950).
import { execFileSync } from 'node:child_process'
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { PNG } from 'pngjs'
import { join } from 'node:path'
import { inflateSync } from 'node:zlib'
import { PDFArray, PDFDocument, PDFRawStream, PDFRef, type PDFPage } from 'pdf-lib'
import { beforeAll, describe, expect, it } from 'vitest'
import { renderTemplatePdf, planTemplate } from '../../../geometry/export/template-pdf'
import { plateToPage, type PaperName } from '../../../geometry/export/tiling'
import { loadTemplateFontNode } from '../../../geometry/export/fonts-node'
import type { Point } from '../../../geometry/types'
import { buildPlate, plateParamsSchema, PRESETS } from '../../../geometry/index'
import { EndType, JoinType, areaD, inflatePathsD } from 'clipper2-ts'
import { distanceToPolygon, fixturePlate, shoelace } from './fixture'
import { bodyStream, pageStream, strokedPaths, type Pt } from './pdf-read'

const PT_PER_MM = 72 / 25.4 // ISO 32000-1, 8.3.2.3; 25.4 mm per inch
const meta = { designName: 'Test oak', sizeLabel: '12 in', revision: 4, date: '2025-03-01' }
let font: Uint8Array

beforeAll(async () => {
  font = await loadTemplateFontNode()
})

function pageStreams(doc: PDFDocument, page: PDFPage): string {
  const contents = page.node.Contents()
  const refs = contents instanceof PDFArray ? contents.asArray() : contents ? [contents] : []
  return refs
    .map((r) => {
      const stream = r instanceof PDFRef ? doc.context.lookup(r) : r
      if (!(stream instanceof PDFRawStream)) throw new Error('unexpected stream type')
      return inflateSync(Buffer.from(stream.contents)).toString('latin1')
    })
    .join('\n')
}

/** The matrix placed right before the drawing on a sheet. */
function bodyMatrix(content: string): number[] {
  const m = /([-\d.]+) ([-\d.]+) ([-\d.]+) ([-\d.]+) ([-\d.]+) ([-\d.]+) cm\n\/RpBody Do/.exec(content)
  if (!m) throw new Error('no placement of the drawing on this page')
  return m.slice(1).map(Number)
}

describe('renderTemplatePdf page sizes', () => {
  const plate = fixturePlate({ radius: 300, amplitude: 0 })
  const cases: [PaperName, number, number, string][] = [
    ['a4', 595.28, 841.89, 'ISO 216'],
    ['a3', 841.89, 1190.55, 'ISO 216'],
    ['letter', 612, 792, 'ASME Y14.1'],
    ['tabloid', 792, 1224, 'ASME Y14.1'],
    ['legal', 612, 1008, 'common practice'],
  ]
  for (const [paper, w, h, source] of cases) {
    it(`${paper} pages are ${w} x ${h} pt (${source}; 72 pt per inch, ISO 32000-1 8.3.2.3)`, async () => {
      const doc = await PDFDocument.load(await renderTemplatePdf(plate, { paper, orientation: 'portrait', meta, font }))
      for (const page of doc.getPages()) {
        const { width, height } = page.getSize()
        expect(width).toBeCloseTo(w, 1)
        expect(height).toBeCloseTo(h, 1)
      }
      const landscape = await PDFDocument.load(await renderTemplatePdf(plate, { paper, orientation: 'landscape', meta, font }))
      const last = landscape.getPages().at(-1)!.getSize()
      expect(last.width).toBeCloseTo(h, 1)
      expect(last.height).toBeCloseTo(w, 1)
    })
  }

  it('cuts roll pages to the plate, no longer than 14,400 pt (ISO 32000-1 Annex C)', async () => {
    const big = fixturePlate({ radius: 762, amplitude: 0 })
    const doc = await PDFDocument.load(await renderTemplatePdf(big, { paper: 'roll-36in', meta, font }))
    const sheets = doc.getPages().slice(1)
    expect(sheets.length).toBeGreaterThan(0)
    for (const p of sheets) {
      const { width, height } = p.getSize()
      expect(Math.min(width, height)).toBeCloseTo(36 * 72, 3)
      expect(Math.max(width, height)).toBeLessThanOrEqual(14400)
    }
  })
})

describe('renderTemplatePdf sheets', () => {
  // The 1200 mm circle of tiling.test.ts: 7 x 5 Letter sheets less 4 empty corners = 31, plus the cover.
  const plate = fixturePlate({ radius: 600, amplitude: 0 })
  let doc: PDFDocument

  beforeAll(async () => {
    doc = await PDFDocument.load(await renderTemplatePdf(plate, { paper: 'letter', meta, font }))
  })

  it('has a cover and one page per printed sheet (31 + 1, counted by hand)', () => {
    expect(doc.getPageCount()).toBe(32)
  })

  it('draws at exactly 1:1 and puts a point of the overlap where the tiling says, on both neighbours', () => {
    const { tiling } = planTemplate(plate, { paper: 'letter' })
    // A1 is left out, so A2 is page 2 and A3 page 3 (index 1 and 2).
    const a2 = tiling.sheets.find((s) => s.label === 'R1-C2')!
    const a3 = tiling.sheets.find((s) => s.label === 'R1-C3')!
    const m2 = bodyMatrix(pageStreams(doc, doc.getPage(1)))
    const m3 = bodyMatrix(pageStreams(doc, doc.getPage(2)))
    for (const m of [m2, m3]) {
      expect(m[0]).toBeCloseTo(PT_PER_MM, 5)
      expect(m[3]).toBeCloseTo(PT_PER_MM, 5)
      expect(m[1]).toBe(0)
      expect(m[2]).toBe(0)
    }
    const p: Point = [-285.75, 500]
    const apply = (m: number[]) => [m[0]! * p[0] + m[4]!, m[3]! * p[1] + m[5]!]
    const onA2 = apply(m2)
    const onA3 = apply(m3)
    // Hand figures from tiling.test.ts: 576 pt on A2, 36 pt on A3, same height.
    expect(onA2[0]).toBeCloseTo(576, 2)
    expect(onA3[0]).toBeCloseTo(36, 2)
    expect(onA2[1]).toBeCloseTo(onA3[1]!, 3)
    expect(onA2[0]).toBeCloseTo(plateToPage(tiling, a2, p)[0], 3)
    expect(onA3[0]).toBeCloseTo(plateToPage(tiling, a3, p)[0], 3)
  })

  it('clips each sheet to its printable window', () => {
    const content = pageStreams(doc, doc.getPage(1))
    // Letter portrait less 1/4 in each side: 8 x 10.5 in = 576 x 756 pt, from (18, 18).
    expect(content).toMatch(/q\n18 18 576 756 re\nW n\n/)
  })

  it('writes the design name and metadata', () => {
    expect(doc.getTitle()).toBe('Test oak - Plate template')
    expect(doc.getCreator()).toBe('Rootplate')
  })

  it('adds the router pattern line only when a bushing is given, inside the outline, on the same sheets', () => {
    // The bushing rides the pattern and the bit cuts (bushing - bit) / 2 beyond it, so the pattern
    // for an outside profile is that much smaller (router pattern practice, common practice).
    // A 600 mm round fixture with pockets well clear of the edge: nothing out of the bushing's reach.
    const small = fixturePlate({ radius: 300, amplitude: 0, casterOffset: 150, pocketDiameter: 100 })
    const plain = planTemplate(small, { paper: 'letter' })
    const routed = planTemplate(small, { paper: 'letter', bushing: { bushingDiameter: 30, bitDiameter: 10 } })
    expect(routed.tiling.content.maxX).toBeCloseTo(plain.tiling.content.maxX, 6)
    expect(routed.tiling.printed).toBe(plain.tiling.printed)
    expect(routed.drawing.legend.map((l) => l.label)).toEqual([...plain.drawing.legend.map((l) => l.label), 'router pattern line (guide bushing)'])
  })

  it('rejects a bad paper or unit', async () => {
    await expect(renderTemplatePdf(plate, { paper: 'b5' as never, font })).rejects.toThrow(/Unknown paper/)
    await expect(renderTemplatePdf(plate, { paper: 'letter', units: 'cm' as never, font })).rejects.toThrow(/Unknown units/)
  })
})

describe('picture check', () => {
  const pdftoppm = '/usr/bin/pdftoppm'
  const out = join(process.cwd(), 'test-results', 'export')

  it('renders the cover and a content sheet to PNG (poppler-utils pdftoppm)', async () => {
    mkdirSync(out, { recursive: true })
    const plate = buildPlate(plateParamsSchema.parse(PRESETS[0]!.input))
    const bytes = await renderTemplatePdf(plate, {
      paper: 'letter',
      meta: { designName: 'Picture check oak', sizeLabel: '12 in', revision: 2, date: '2025-03-01' },
      bushing: { bushingDiameter: 15.875, bitDiameter: 12.7 },
      font,
    })
    const pdf = join(out, 'template.pdf')
    writeFileSync(pdf, bytes)
    const { tiling } = planTemplate(plate, { paper: 'letter', bushing: { bushingDiameter: 15.875, bitDiameter: 12.7 } })
    // A sheet holding the first pocket, with its rabbet, caster plate and bolt holes.
    const printed = tiling.sheets.filter((s) => !s.empty)
    const pocket = plate.holes.find((h) => h.kind === 'pocket')!
    const holding = printed.filter((s) => s.window.minX < pocket.x && pocket.x < s.window.maxX && s.window.minY < pocket.y && pocket.y < s.window.maxY)
    const target = holding[0]!
    const pageNo = printed.indexOf(target) + 2
    execFileSync(pdftoppm, ['-png', '-r', '50', '-f', '1', '-l', '1', '-singlefile', pdf, join(out, 'cover')])
    const dpi = 100
    execFileSync(pdftoppm, ['-png', '-r', String(dpi), '-f', String(pageNo), '-l', String(pageNo), '-singlefile', pdf, join(out, `sheet-${target.label}`)])
    // At 50 dpi a Letter page is 425 x 550 px: the rasteriser read the page at its true size.
    const png = readFileSync(join(out, 'cover.png'))
    expect(png.readUInt32BE(16)).toBe(425)
    expect(png.readUInt32BE(20)).toBe(550)
    // The pocket sheet, measured in pixels: its pocket circle is drawn full size, as round as it is wide.
    const sheet = PNG.sync.read(readFileSync(join(out, `sheet-${target.label}.png`)))
    // Letter at 100 dpi, 8.5 x 11 in (ASME Y14.1), either way round.
    expect([sheet.width, sheet.height].sort()).toEqual([1100, 850].sort())
    // A point inside the pocket: its label, found by poppler's own text boxes (pdftotext -bbox), in px.
    const box = execFileSync('pdftotext', ['-bbox', '-f', String(pageNo), '-l', String(pageNo), pdf, '-']).toString('utf8')
    const m = /<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">pocket<\/word>/.exec(box)!
    expect(m).not.toBeNull()
    const px = dpi / 72
    const label: Point = [((Number(m[1]) + Number(m[3])) / 2) * px, ((Number(m[2]) + Number(m[4])) / 2) * px]
    // Outline green (pocket walls are cut lines): green well above red, and not a pale tint.
    const green = (x: number, y: number) => {
      const i = (y * sheet.width + x) * 4
      const [r, g, b] = [sheet.data[i]!, sheet.data[i + 1]!, sheet.data[i + 2]!]
      return g - r > 40 && r + g + b < 450
    }
    const r = (pocket.diameter / 2 / 25.4) * dpi
    /** Bounding box of the green pixels between `inner` and `outer` px from `c`. */
    const ringBox = (c: Point, inner: number, outer: number) => {
      const b = { minX: Infinity, maxX: -Infinity, minY: Infinity, maxY: -Infinity }
      for (let y = Math.max(0, Math.floor(c[1] - outer)); y <= Math.min(sheet.height - 1, c[1] + outer); y++) {
        for (let x = Math.max(0, Math.floor(c[0] - outer)); x <= Math.min(sheet.width - 1, c[0] + outer); x++) {
          const d = Math.hypot(x - c[0], y - c[1])
          if (d >= inner && d <= outer && green(x, y)) Object.assign(b, { minX: Math.min(b.minX, x), maxX: Math.max(b.maxX, x), minY: Math.min(b.minY, y), maxY: Math.max(b.maxY, y) })
        }
      }
      return b
    }
    // The label sits off the pocket's centre: a rough ring first, then a tight one round the centre it gives.
    const rough = ringBox(label, r - 0.8 * dpi, r + 0.6 * dpi)
    const b = ringBox([(rough.minX + rough.maxX) / 2, (rough.minY + rough.maxY) / 2], r - 0.3 * dpi, r + 0.3 * dpi)
    // Outer extent of the stroke: the diameter plus one stroke width and antialiasing (under 4 px, 1 mm, at 100 dpi); 25.4 mm per inch (NIST SP 811).
    for (const across of [b.maxX - b.minX, b.maxY - b.minY]) {
      expect(across).toBeGreaterThan(2 * r - 1)
      expect(across).toBeLessThan(2 * r + 4)
    }
  })
})

describe('picture check of the pattern line (poppler-utils pdftoppm)', () => {
  const pdftoppm = '/usr/bin/pdftoppm'
  const out = join(process.cwd(), 'test-results', 'export')

  it('renders the banyan starting shape with a 1-1/4 in bushing: a sheet with a root out of reach, and the cover', async () => {
    mkdirSync(out, { recursive: true })
    const plate = buildPlate(plateParamsSchema.parse(PRESETS.find((p) => p.id === 'banyan-sprawl')!.input))
    const options = { paper: 'letter' as const, bushing: { bushingDiameter: 31.75, bitDiameter: 6.35 } }
    const pdf = join(out, 'template-banyan-bushing.pdf')
    writeFileSync(pdf, await renderTemplatePdf(plate, { ...options, meta: { designName: 'Banyan bushing check', date: '2025-03-01' }, font }))
    const { tiling } = planTemplate(plate, options)
    const printed = tiling.sheets.filter((s) => !s.empty)
    // The tip of the longest root: the outline point furthest from the centre, narrower than 2 x 12.7 mm there.
    const tip = plate.outline.reduce((a, b) => (Math.hypot(...b) > Math.hypot(...a) ? b : a))
    const holding = printed.findIndex((s) => s.window.minX < tip[0] && tip[0] < s.window.maxX && s.window.minY < tip[1] && tip[1] < s.window.maxY)
    expect(holding).toBeGreaterThanOrEqual(0)
    execFileSync(pdftoppm, ['-png', '-r', '100', '-f', String(holding + 2), '-l', String(holding + 2), '-singlefile', pdf, join(out, 'banyan-root-sheet')])
    execFileSync(pdftoppm, ['-png', '-r', '60', '-f', '1', '-l', '1', '-singlefile', pdf, join(out, 'banyan-cover')])
    // 100 dpi of a Letter sheet in either orientation: 850 x 1100 px.
    const png = readFileSync(join(out, 'banyan-root-sheet.png'))
    expect([png.readUInt32BE(16), png.readUInt32BE(20)].sort()).toEqual([1100, 850])
  }, 60_000)
})

describe('the pattern line read back from the PDF (pdf-lib, node:zlib)', () => {
  // A lobed fixture, its pockets clear of the edge by more than twice either offset.
  const plate = fixturePlate({ radius: 400, amplitude: 60, lobes: 3, casterOffset: 200 })
  /** Closed subpaths stroked with the pattern line's long dash. */
  async function patternRings(bushingDiameter: number, bitDiameter: number): Promise<Pt[][]> {
    const bytes = await renderTemplatePdf(plate, { paper: 'tabloid', bushing: { bushingDiameter, bitDiameter }, meta, font })
    const paths = strokedPaths(bodyStream(await PDFDocument.load(bytes)))
    return paths.filter((p) => p.dash === '[5 2] 0').flatMap((p) => p.subpaths.filter((s) => s.closed).map((s) => s.points))
  }
  /** clipper2-ts called here on its own: the outline offset inward by d with round joins. */
  function clipperArea(d: number): number {
    const out = inflatePathsD([plate.outline.map(([x, y]) => ({ x, y }))], -d, JoinType.Round, EndType.Polygon, 2, 3)
    return out.reduce((s, p) => s + areaD(p), 0)
  }

  it.each([
    [15.875, 12.7, 1.5875, '5/8 in bushing, 1/2 in bit'],
    [31.75, 6.35, 12.7, '1-1/4 in bushing, 1/4 in bit'],
  ])('bushing %s mm, bit %s mm: the pattern lies (bushing - bit) / 2 = %s mm inside the cut line (%s)', async (bushing, bit, d) => {
    const rings = await patternRings(bushing, bit)
    // One outside ring and one ring round each pocket and access opening.
    const routed = plate.holes.filter((h) => h.kind === 'pocket' || h.kind === 'access')
    expect(rings).toHaveLength(1 + routed.length)
    const outside = rings.reduce((a, b) => (Math.abs(shoelace(b)) > Math.abs(shoelace(a)) ? b : a))
    for (const p of outside) {
      const at = distanceToPolygon(p, plate.outline)
      // Coordinates are written to 0.001 mm: the distance holds to 0.1 mm (the guide-line contract).
      expect(at).toBeGreaterThan(d - 0.1)
      expect(at).toBeLessThan(d + 0.1)
    }
    expect(Math.abs(Math.abs(shoelace(outside)) - clipperArea(d)) / clipperArea(d)).toBeLessThan(1e-4)
    // Each opening's pattern is its circle grown by d (the bushing rides inside it).
    for (const h of routed) {
      const ring = rings.find((r) => r.every(([x, y]) => Math.hypot(x - h.x, y - h.y) < h.diameter / 2 + d + 1))
      expect(ring, h.id).toBeDefined()
      for (const [x, y] of ring!) expect(Math.abs(Math.hypot(x - h.x, y - h.y) - (h.diameter / 2 + d))).toBeLessThan(0.02)
    }
  })

  it('a bigger bushing moves the line further in: areas differ as clipper2-ts says', async () => {
    const near = await patternRings(15.875, 12.7)
    const far = await patternRings(31.75, 6.35)
    const area = (rings: Pt[][]) => Math.max(...rings.map((r) => Math.abs(shoelace(r))))
    expect(area(near) - area(far)).toBeCloseTo(clipperArea(1.5875) - clipperArea(12.7), -1)
    expect(area(near)).toBeGreaterThan(area(far))
  })

  it('on the banyan starting shape with a 2 in bushing and 1/4 in bit, every stretch the pattern misses is hatched (its 1/2 in root tips are tighter than the 7/8 in offset)', { timeout: 60_000 }, async () => {
    const banyan = buildPlate(plateParamsSchema.parse(PRESETS.find((p) => p.id === 'banyan-sprawl')!.input))
    const bytes = await renderTemplatePdf(banyan, { paper: 'tabloid', bushing: { bushingDiameter: 50.8, bitDiameter: 6.35 }, meta, font })
    const paths = strokedPaths(bodyStream(await PDFDocument.load(bytes)))
    const pattern = paths.filter((p) => p.dash === '[5 2] 0').flatMap((p) => p.subpaths.map((s) => s.points))
    const hatched = paths.filter((p) => p.dash === '[1.2 1.2] 0').flatMap((p) => p.subpaths.map((s) => s.points))
    // Points of the cut line further than (50.8 - 6.35) / 2 + 0.1 mm from every pattern line: the bushing cannot bring the bit to them.
    const missed = banyan.outline.filter((p) => Math.min(...pattern.map((r) => distanceToPolygon(p, r))) > 22.225 + 0.1)
    expect(missed.length).toBeGreaterThan(0)
    for (const p of missed) {
      const near = Math.min(...hatched.map((run) => distanceToOpen(p, run)))
      expect(near, `cut point ${p} is out of reach but not hatched`).toBeLessThan(0.01)
    }
  })
})

describe('scale bars', () => {
  it('every content sheet has a 1 in and a 25 mm bar both level and upright (72 pt and 70.866 pt, ISO 32000-1 8.3.2.3)', async () => {
    const plate = fixturePlate({ radius: 400, amplitude: 60 })
    const doc = await PDFDocument.load(await renderTemplatePdf(plate, { paper: 'letter', meta, font }))
    const sheets = doc.getPages().slice(1)
    expect(sheets.length).toBeGreaterThan(1)
    const mm25 = 25 * PT_PER_MM
    for (const page of sheets) {
      const segments = strokedPaths(pageStream(doc, page)).flatMap((p) => p.subpaths).filter((s) => s.points.length === 2)
      const level = (len: number) => segments.some(({ points: [a, b] }) => Math.abs(a![1] - b![1]) < 1e-6 && Math.abs(Math.abs(b![0] - a![0]) - len) < 0.01)
      const upright = (len: number) => segments.some(({ points: [a, b] }) => Math.abs(a![0] - b![0]) < 1e-6 && Math.abs(Math.abs(b![1] - a![1]) - len) < 0.01)
      expect(level(72)).toBe(true)
      expect(level(mm25)).toBe(true)
      expect(upright(72)).toBe(true)
      expect(upright(mm25)).toBe(true)
    }
  })
})

function distanceToOpen(p: Point | Pt, run: Pt[]): number {
  let best = Infinity
  for (let i = 0; i + 1 < run.length; i++) {
    const a = run[i]!
    const b = run[i + 1]!
    const dx = b[0] - a[0]
    const dy = b[1] - a[1]
    const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy || 1)))
    best = Math.min(best, Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy))
  }
  return best
}
