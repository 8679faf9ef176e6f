import { execFileSync } from 'node:child_process'
import { existsSync, mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { PDFDocument } from 'pdf-lib'
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

  it('renders a sheet to PNG for a look (poppler-utils pdftoppm)', async () => {
    const out = join(process.cwd(), 'test-results', 'export')
    mkdirSync(out, { recursive: true })
    const plate: Plate = fixturePlate({ tubeDiameter: 305 })
    const pdf = join(out, 'tube-wrap.pdf')
    writeFileSync(pdf, await renderTubeWrapPdf(plate, { paper: 'letter', font, meta: { designName: 'Wrap test', revision: 1, date: '2025-03-01' } }))
    execFileSync('/usr/bin/pdftoppm', ['-png', '-r', '50', '-f', '2', '-l', '2', '-singlefile', pdf, join(out, 'tube-wrap-A1')])
    expect(existsSync(join(out, 'tube-wrap-A1.png'))).toBe(true)
  })
})
