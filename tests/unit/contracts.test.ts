import { describe, expect, it } from 'vitest'
import DxfParser from 'dxf-parser'
import { PDFDocument } from 'pdf-lib'
import * as geometry from '../../geometry'

// The fixed names of CONTRACTS.md, called exactly as an outside check would.
describe('geometry module contract', () => {
  it('parses {} into a valid plate and builds it with the documented fields', () => {
    const params = geometry.plateParamsSchema.parse({})
    for (const key of ['tubeDiameter', 'casterCount', 'casterOffset', 'pocketDiameter', 'rotation', 'minWood', 'lobes']) {
      expect(params).toHaveProperty(key)
    }
    const plate = geometry.buildPlate(params)
    expect(plate.outline.length).toBeGreaterThan(16)
    expect(plate.holes.map(h => h.kind)).toEqual(expect.arrayContaining(['pocket', 'access', 'centre', 'index']))
    expect(plate.metrics.area).toBeGreaterThan(0)
    expect(plate.findings).toEqual([])
  })

  it('renders a Letter template with only { paper } given (1 mm = 72/25.4 pt: ISO 32000-1 8.3.2.3; Letter 612x792 pt: ASME Y14.1)', async () => {
    const plate = geometry.buildPlate(geometry.plateParamsSchema.parse({}))
    const bytes = await geometry.renderTemplatePdf(plate, { paper: 'letter' })
    const doc = await PDFDocument.load(bytes)
    expect(doc.getPageCount()).toBeGreaterThan(1)
    const sizes = doc.getPages().map(p => p.getSize()).map(s => [Math.round(s.width), Math.round(s.height)].sort((a, b) => a - b))
    for (const s of sizes) expect(s).toEqual([612, 792])
  })

  it('renders a DXF in inches and in millimetres ($INSUNITS 1 and 4: DXF Reference, HEADER section)', () => {
    const plate = geometry.buildPlate(geometry.plateParamsSchema.parse({}))
    const parser = new DxfParser()
    expect(parser.parseSync(geometry.renderCutDxf(plate, { units: 'in' }))?.header?.$INSUNITS).toBe(1)
    expect(parser.parseSync(geometry.renderCutDxf(plate, { units: 'mm' }))?.header?.$INSUNITS).toBe(4)
  })
})
