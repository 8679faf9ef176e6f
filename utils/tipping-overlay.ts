// The tipping line on the plate canvas: the side of the wheels' support the
// unit tips over first, with every wheel swivelled the worst way. Client only.
import type { Point } from '~~/geometry/core'

export const tippingColour = '#b4452f'

export function drawTippingLine(scope: paper.PaperScope, layer: paper.Layer, line: [Point, Point], zoom: number, label: string): void {
  const [a, b] = line
  const path = new scope.Path({ segments: [pt(scope, a[0], a[1]), pt(scope, b[0], b[1])], insert: false })
  Object.assign(path, { strokeColor: tippingColour, strokeWidth: 2, dashArray: [10, 5], strokeScaling: false })
  layer.addChild(path)
  const text = new scope.PointText({
    point: pt(scope, (a[0] + b[0]) / 2, (a[1] + b[1]) / 2),
    content: label,
    justification: 'center',
    fillColor: tippingColour,
    fontFamily: 'IBM Plex Sans',
    fontSize: 12 / zoom,
    insert: false,
  })
  layer.addChild(text)
}
