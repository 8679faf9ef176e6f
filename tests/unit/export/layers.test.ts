// One cut file per plate layer, read back with an independent reader
// (dxf-parser 1.1.2; pdf-lib with node:zlib for the template). The shop's
// practice (PRODUCT.md, common practice): the top layer carries the rabbets
// the pan rims sit in, the bottom layer none; both carry the centre and index
// holes so the layers and the pattern register on each other. A file cut from
// the back face (mirrored) must not carry a rabbet: it would land on the face
// the machine cannot reach.
import DxfParser, { type ICircleEntity, type IDxf } from 'dxf-parser'
import { inflateSync } from 'node:zlib'
import { PDFDocument, PDFName, PDFRawStream, type PDFDict } from 'pdf-lib'
import { beforeAll, describe, expect, it } from 'vitest'
import type { Plate } from '../../../geometry/types'
import { buildPlate, plateParamsSchema, PRESETS } from '../../../geometry/index'
import { renderCutDxf } from '../../../geometry/export/dxf'
import { renderCutSvg } from '../../../geometry/export/svg'
import { renderTemplatePdf } from '../../../geometry/export/template-pdf'
import { MirrorRabbetError } from '../../../geometry/export/layers'
import { loadTemplateFontNode } from '../../../geometry/export/fonts-node'
import { fixturePlate } from './fixture'

const IN = 25.4 // mm per inch, exact (NIST SP 811)

function parse(text: string): IDxf {
  const dxf = new DxfParser().parseSync(text)
  if (!dxf) throw new Error('dxf-parser read nothing')
  return dxf
}

/** Circles on any layer that is machined (everything but the reference layer). */
function cutCircles(dxf: IDxf): ICircleEntity[] {
  return dxf.entities.filter((e) => e.type === 'CIRCLE' && e.layer !== 'RP-REFERENCE') as ICircleEntity[]
}

function hasCircle(dxf: IDxf, x: number, y: number, diameter: number, k = 1): boolean {
  return cutCircles(dxf).some((c) => Math.abs(c.center.x - x * k) < 1e-6 && Math.abs(c.center.y - y * k) < 1e-6 && Math.abs(c.radius * 2 - diameter * k) < 1e-6)
}

const rabbetEntities = (dxf: IDxf) => dxf.entities.filter((e) => e.layer.startsWith('RP-RABBET-'))
const rabbetLayers = (dxf: IDxf) => Object.keys(dxf.tables.layer.layers).filter((name) => name.startsWith('RP-RABBET-'))

const plates: [string, () => Plate][] = [
  ['a hand-built three-caster fixture', () => fixturePlate()],
  ['the default plate', () => buildPlate(plateParamsSchema.parse({}))],
  ['the river stone starting shape', () => buildPlate(plateParamsSchema.parse(PRESETS.find((p) => p.id === 'river-stone')!.input))],
]

describe.each(plates)('per-layer DXF of %s', (_name, make) => {
  const plate = make()

  it('top: one rabbet circle per pocket, of the rabbet diameter, on a rabbet layer', () => {
    const dxf = parse(renderCutDxf(plate, { units: 'in', layer: 'top' }))
    const circles = rabbetEntities(dxf) as ICircleEntity[]
    expect(plate.rabbets.length).toBeGreaterThan(0)
    expect(circles).toHaveLength(plate.rabbets.length)
    for (const r of plate.rabbets) {
      expect(circles.some((c) => Math.abs(c.center.x - r.x / IN) < 1e-6 && Math.abs(c.radius * 2 * IN - r.diameter) < 1e-6)).toBe(true)
    }
  })

  it('bottom: no rabbet layer and no entity on one', () => {
    const dxf = parse(renderCutDxf(plate, { units: 'mm', layer: 'bottom' }))
    expect(rabbetEntities(dxf)).toHaveLength(0)
    expect(rabbetLayers(dxf)).toHaveLength(0)
    // The rest is still there: the outline and every through hole.
    expect(dxf.entities.filter((e) => e.layer === 'RP-OUTSIDE-CUT')).toHaveLength(1)
  })

  it.each(['top', 'bottom', 'all'] as const)('%s: the centre hole and every index hole are cut, at their place and size', (layer) => {
    const dxf = parse(renderCutDxf(plate, { units: 'mm', layer }))
    const register = plate.holes.filter((h) => h.kind === 'centre' || h.kind === 'index')
    expect(register.some((h) => h.kind === 'centre')).toBe(true)
    expect(register.some((h) => h.kind === 'index')).toBe(true)
    for (const h of register) expect(hasCircle(dxf, h.x, h.y, h.diameter), `${h.id} on the ${layer} layer`).toBe(true)
  })

  it('all (the default): the same entities as top, for a panel glued before cutting', () => {
    const all = parse(renderCutDxf(plate, { units: 'mm' }))
    const top = parse(renderCutDxf(plate, { units: 'mm', layer: 'top' }))
    expect(all.entities.length).toBe(top.entities.length)
    expect(rabbetEntities(all)).toHaveLength(plate.rabbets.length)
  })
})

describe('mirroring', () => {
  const plate = fixturePlate()

  it.each(['top', 'all'] as const)('refuses to mirror the %s file, which carries rabbets, with a clear message', (layer) => {
    expect(() => renderCutDxf(plate, { units: 'mm', layer, mirror: true })).toThrow(MirrorRabbetError)
    expect(() => renderCutDxf(plate, { units: 'mm', layer, mirror: true })).toThrow(/rabbets would land on the face the machine cannot reach/)
    expect(() => renderCutSvg(plate, { units: 'mm', layer, mirror: true })).toThrow(MirrorRabbetError)
  })

  it('mirrors the bottom layer: every hole at (-x, y), centre and index holes included', () => {
    const dxf = parse(renderCutDxf(plate, { units: 'mm', layer: 'bottom', mirror: true }))
    for (const h of plate.holes) expect(hasCircle(dxf, -h.x, h.y, h.diameter), h.id).toBe(true)
    expect(rabbetEntities(dxf)).toHaveLength(0)
  })

  it('mirrors a top layer that has no rabbets at all', () => {
    const bare: Plate = { ...plate, rabbets: [] }
    expect(() => renderCutDxf(bare, { units: 'mm', layer: 'top', mirror: true })).not.toThrow()
  })

  it('refuses an unknown layer', () => {
    expect(() => renderCutDxf(plate, { units: 'mm', layer: 'middle' as never })).toThrow(/Unknown layer "middle"/)
  })
})

describe('per-layer SVG', () => {
  const plate = fixturePlate()
  it('the bottom layer has no rabbet group; the top layer has one with a circle per rabbet', () => {
    const bottom = renderCutSvg(plate, { units: 'mm', layer: 'bottom' })
    const top = renderCutSvg(plate, { units: 'mm', layer: 'top' })
    expect(bottom).not.toMatch(/data-operation="rabbet"/)
    const group = /<g id="RP-RABBET-[^"]+" data-operation="rabbet"[^>]*>([\s\S]*?)<\/g>/.exec(top)
    expect(group).not.toBeNull()
    expect(group![1]!.match(/<circle /g)).toHaveLength(plate.rabbets.length)
  })
})

describe('per-layer template PDF', () => {
  let font: Uint8Array
  beforeAll(async () => {
    font = await loadTemplateFontNode()
  })
  const plate = fixturePlate({ radius: 300, amplitude: 40 })

  /** The drawing (form XObject /RpBody) of the first content sheet, inflated (Flate, RFC 1950). */
  async function body(layer: 'top' | 'bottom' | 'all'): Promise<{ doc: PDFDocument; text: string }> {
    const doc = await PDFDocument.load(await renderTemplatePdf(plate, { paper: 'tabloid', layer, font, meta: { designName: 'Layer test', date: '2025-03-01' } }))
    const resources = doc.getPage(1).node.Resources()!
    const xobjects = resources.lookup(PDFName.of('XObject')) as PDFDict
    const stream = xobjects.lookup(PDFName.of('RpBody'))
    if (!(stream instanceof PDFRawStream)) throw new Error('no drawing on the sheet')
    return { doc, text: inflateSync(Buffer.from(stream.contents)).toString('latin1') }
  }

  it('the bottom layer template draws no rabbet and says which layer it is for', async () => {
    const { doc, text } = await body('bottom')
    expect(text).not.toMatch(/\[3 1\.6\] 0 d/) // the rabbet ring's dash
    expect(doc.getTitle()).toBe('Layer test - Plate template, bottom layer')
    const top = await body('top')
    // One dashed rabbet ring per pocket on the top layer's template.
    expect(top.text.match(/\[3 1\.6\] 0 d/g)).toHaveLength(plate.rabbets.length)
    expect(top.doc.getTitle()).toBe('Layer test - Plate template, top layer')
  })
})
