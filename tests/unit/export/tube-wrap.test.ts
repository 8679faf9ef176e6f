import { execFileSync } from 'node:child_process'
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { PDFDocument } from 'pdf-lib'
import { PNG } from 'pngjs'
import { beforeAll, describe, expect, it } from 'vitest'
import { planTubeWrap, renderTubeWrapPdf, tubeWrapLayout } from '../../../geometry/export/tube-wrap-pdf'
import { loadTemplateFontNode } from '../../../geometry/export/fonts-node'
import type { Plate } from '../../../geometry/types'
import { fixturePlate } from './fixture'

let font: Uint8Array
beforeAll(async () => {
  font = await loadTemplateFontNode()
})

describe('tubeWrapLayout', () => {
  const plate = fixturePlate({ tubeDiameter: 305 })

  it('is as long as the outside circumference, pi x diameter', () => {
    const layout = tubeWrapLayout(plate)
    expect(layout.circumference).toBeCloseTo(Math.PI * 305, 9)
    // 6 in tall unless set (25.4 mm per inch, NIST SP 811)
    expect(layout.height).toBeCloseTo(152.4, 9)
  })

  it('places each notch at its offset along the wrap, split in two where it crosses the index line', () => {
    const layout = tubeWrapLayout(plate)
    const C = layout.circumference
    // The fixture's first pocket sits on the clocking axis (offset 0): half its notch at each end.
    const first = layout.notches[0]!
    const w = plate.notches[0]!.width
    expect(first.spans).toHaveLength(2)
    expect(first.spans[0]![1]).toBeCloseTo(w / 2, 9)
    expect(first.spans[1]![0]).toBeCloseTo(C - w / 2, 9)
    // The second pocket at 120 degrees: a third of the way round.
    const second = layout.notches[1]!
    expect(second.centre).toBeCloseTo(C / 3, 9)
    expect(second.spans).toEqual([[C / 3 - w / 2, C / 3 + w / 2]])
  })

  it('rejects a strip with no height', () => {
    expect(() => tubeWrapLayout(plate, { height: 0 })).toThrow(/height/)
  })
})

describe('renderTubeWrapPdf', () => {
  it('tiles the strip: a 12 in tube on Letter landscape (hand count)', async () => {
    // Strip 958.19 + 25.4 tab = 983.59 mm long, 152.4 tall; content 991.59 x 160.4 with 4 mm clear.
    // Landscape: printable 266.7 x 203.2, step 254: cols = ceil((991.59 - 12.7) / 254) = ceil(3.85) = 4, one row.
    // Portrait: step 190.5: ceil(978.89 / 190.5) = ceil(5.14) = 6. So auto picks landscape, 4 sheets + cover.
    const plate = fixturePlate({ tubeDiameter: 305 })
    const { tiling } = planTubeWrap(plate, { paper: 'letter' })
    expect(tiling.orientation).toBe('landscape')
    expect([tiling.cols, tiling.rows]).toEqual([4, 1])
    const doc = await PDFDocument.load(await renderTubeWrapPdf(plate, { paper: 'letter', font, meta: { designName: 'Wrap test', revision: 1 } }))
    expect(doc.getPageCount()).toBe(5)
    // Letter landscape, 792 x 612 pt (ASME Y14.1 at 72 pt per inch)
    const { width, height } = doc.getPage(1).getSize()
    expect([width, height]).toEqual([792, 612])
  })

  it('renders the first sheet (poppler-utils pdftoppm) with the strip 6 in tall and the split notch 1 in high, measured in pixels', async () => {
    const out = join(process.cwd(), 'test-results', 'export')
    mkdirSync(out, { recursive: true })
    const plate: Plate = fixturePlate({ tubeDiameter: 305 })
    const pdf = join(out, 'tube-wrap.pdf')
    writeFileSync(pdf, await renderTubeWrapPdf(plate, { paper: 'letter', font, meta: { designName: 'Wrap test', revision: 1, date: '2025-03-01' } }))
    const dpi = 100
    execFileSync('/usr/bin/pdftoppm', ['-png', '-r', String(dpi), '-f', '2', '-l', '2', '-singlefile', pdf, join(out, 'tube-wrap-A1')])
    const png = PNG.sync.read(readFileSync(join(out, 'tube-wrap-A1.png')))
    // Letter landscape, 11 x 8.5 in (ASME Y14.1), at 100 dpi.
    expect([png.width, png.height]).toEqual([1100, 850])
    const dark = (x: number, y: number) => {
      const i = (y * png.width + x) * 4
      return png.data[i]! + png.data[i + 1]! + png.data[i + 2]! < 3 * 128
    }
    const longest = (n: number, at: (k: number) => boolean) => {
      let best = 0
      for (let k = 0, run = 0; k < n; k++) best = Math.max(best, (run = at(k) ? run + 1 : 0))
      return best
    }
    /** Centres of the groups of adjacent indices, e.g. the rows of one stroke. */
    const centres = (list: number[]) => list.reduce<number[][]>((g, k) => (g.length && k - g.at(-1)!.at(-1)! === 1 ? g.at(-1)!.push(k) : g.push([k]), g), []).map((g) => (g[0]! + g.at(-1)!) / 2)
    // The strip's long sides: the only rows holding a dark run over 8 in long.
    const sides = centres([...Array(png.height).keys()].filter((y) => longest(png.width, (x) => dark(x, y)) > 8 * dpi))
    expect(sides).toHaveLength(2)
    // 6 in (152.4 mm) strip, stroke centre to centre, within 1.5 px of rasterising.
    expect(sides[1]! - sides[0]!).toBeGreaterThan(6 * dpi - 1.5)
    expect(sides[1]! - sides[0]!).toBeLessThan(6 * dpi + 1.5)
    // The index line: the leftmost column holding a dark run over 5 in long.
    const left = [...Array(png.width).keys()].find((x) => longest(png.height, (y) => dark(x, y)) > 5 * dpi)!
    const bottom = Math.round(sides[1]!)
    // The fixture's first notch sits on the index line: half of it, 30 degrees of a 305 mm tube = pi x 305 / 24 mm wide, 25.4 mm high.
    const up = [...Array(2 * dpi).keys()].find((k) => k > 3 && dark(left + dpi / 4, bottom - k))!
    expect(up).toBeGreaterThan(dpi - 2.5)
    expect(up).toBeLessThan(dpi + 2.5)
    const halfWidth = ((Math.PI * 305) / 24 / 25.4) * dpi
    const across = [...Array(3 * dpi).keys()].find((k) => k > 3 && dark(left + k, bottom - dpi / 2))!
    expect(across).toBeGreaterThan(halfWidth - 2.5)
    expect(across).toBeLessThan(halfWidth + 2.5)
  })
})
