import { describe, expect, it } from 'vitest'
import { renderCutSvg } from '../../../geometry/export/svg'
import { buildCutDrawing, LAYER_INSIDE, LAYER_OUTSIDE, LAYER_REFERENCE } from '../../../geometry/export/cut-layers'
import { fixturePlate } from './fixture'

const plate = fixturePlate()

function attr(svg: string, name: string): string {
  const m = new RegExp(`<svg[^>]*\\s${name}="([^"]+)"`).exec(svg)
  if (!m) throw new Error(`no ${name}`)
  return m[1]!
}

describe('renderCutSvg', () => {
  it('is drawn at real size: width and height in inches or millimetres matching the viewBox (SVG 1.1, 7.2 and 7.7)', () => {
    for (const units of ['in', 'mm'] as const) {
      // Without reference marks the extent is the outline's (the clocking axis runs past it).
      const svg = renderCutSvg(plate, { units, includeReference: false })
      const width = attr(svg, 'width')
      const height = attr(svg, 'height')
      expect(width.endsWith(units)).toBe(true)
      expect(height.endsWith(units)).toBe(true)
      const [, , vw, vh] = attr(svg, 'viewBox').split(' ').map(Number)
      expect(Number.parseFloat(width)).toBeCloseTo(vw!, 4)
      expect(Number.parseFloat(height)).toBeCloseTo(vh!, 4)
      // The outline's own width plus a border of a few millimetres for the stroke.
      const across = units === 'in' ? vw! * 25.4 : vw!
      expect(across).toBeGreaterThan(plate.metrics.width)
      expect(across).toBeLessThan(plate.metrics.width + 10)
    }
  })

  it('has the same layers as groups and the same entities as the cut drawing', () => {
    const svg = renderCutSvg(plate, { units: 'mm' })
    const drawing = buildCutDrawing(plate, { units: 'mm' })
    for (const layer of drawing.layers) expect(svg).toContain(`<g id="${layer.name}"`)
    const circles = drawing.layers.flatMap((l) => l.entities).filter((e) => e.type === 'circle').length
    expect(svg.match(/<circle /g)?.length).toBe(circles)
    expect(svg.match(/<polygon /g)?.length).toBe(1 + plate.casterMounts.length)
    const noRef = renderCutSvg(plate, { units: 'mm', includeReference: false })
    expect(noRef).not.toContain(LAYER_REFERENCE)
    expect(noRef).toContain(LAYER_OUTSIDE)
  })

  it('turns y so the drawing is not upside down', () => {
    // A hole above the centre (plate y > 0) must sit above it in SVG, i.e. at a negative cy.
    const above = { ...plate, holes: [{ id: 'access-x', kind: 'access' as const, x: 0, y: 100, diameter: 50, method: 'routed' as const }] }
    const svg = renderCutSvg(above, { units: 'mm' })
    const group = svg.slice(svg.indexOf(`<g id="${LAYER_INSIDE}"`))
    expect(group).toMatch(/<circle cx="0" cy="-100" r="25"\/>/)
  })
})
