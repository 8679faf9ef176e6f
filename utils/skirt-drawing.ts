// Skirt stations on the editor canvas: a short tick out from the plate edge
// along each station's ray, numbered every fifth (and the first) so the
// numbers match the cut list without crowding the edge.
import { skirtStrips, type Plate, type SkirtResult } from '~~/geometry/core'

type Scope = paper.PaperScope

export const skirtColour = '#a0522d'

// The canvas redraws on every pointer move; the strips only change with the plate.
const cache = new WeakMap<Plate, SkirtResult | null>()
export function cachedSkirt(plate: Plate): SkirtResult | null {
  if (!cache.has(plate)) {
    let result: SkirtResult | null = null
    try {
      result = skirtStrips(plate)
    }
    catch {
      // Half-typed settings: draw no stations rather than break the canvas.
      result = null
    }
    cache.set(plate, result)
  }
  return cache.get(plate) ?? null
}

export function drawSkirtStations(scope: Scope, layer: paper.Layer, plate: Plate, zoom: number): void {
  const skirt = cachedSkirt(plate)
  if (!skirt) return
  const px = (n: number) => n / zoom
  for (const s of skirt.strips) {
    const a = (s.angle * Math.PI) / 180
    const c = Math.cos(a)
    const d = Math.sin(a)
    const [x, y] = s.at
    const numbered = s.number === 1 || s.number % 5 === 0
    const len = px(numbered ? 12 : 7)
    const tick = new scope.Path({ segments: [new scope.Point(x - c * px(3), -(y - d * px(3))), new scope.Point(x + c * len, -(y + d * len))], insert: false })
    Object.assign(tick, { strokeColor: skirtColour, strokeWidth: numbered ? 1.6 : 1, strokeScaling: false })
    layer.addChild(tick)
    if (numbered) {
      const at = new scope.Point(x + c * (len + px(8)), -(y + d * (len + px(8))) + px(4))
      layer.addChild(new scope.PointText({ point: at, content: String(s.number), justification: 'center', fillColor: skirtColour, fontFamily: 'IBM Plex Sans', fontSize: px(10), insert: false }))
    }
  }
}
