// A paper.js view on a canvas: loaded in the browser only, with zoom about
// the cursor, pan, fit-to-view and resize. The drawing itself is the caller's.
import type { Ref, ShallowRef } from 'vue'

export type PaperScopeInstance = paper.PaperScope

export interface PaperView {
  scope: ShallowRef<PaperScopeInstance | null>
  ready: Ref<boolean>
  failed: Ref<string | null>
  zoom: Ref<number>
  /** Bumps whenever the view moves, zooms or resizes, so drawings that depend on it redraw. */
  viewVersion: Ref<number>
  zoomBy: (factor: number, anchor?: { x: number; y: number }) => void
  panBy: (dx: number, dy: number) => void
  fit: (bounds: { minX: number; minY: number; maxX: number; maxY: number }, padding?: number) => void
  toPlate: (clientX: number, clientY: number) => { x: number; y: number }
}

export function usePaperView(canvas: Ref<HTMLCanvasElement | null>, box: Ref<HTMLElement | null>): PaperView {
  const scope = shallowRef<PaperScopeInstance | null>(null)
  const ready = ref(false)
  const failed = ref<string | null>(null)
  const zoom = ref(1)
  const viewVersion = ref(0)
  let observer: ResizeObserver | null = null

  const bump = () => {
    if (scope.value) zoom.value = scope.value.view.zoom
    viewVersion.value++
  }

  onMounted(async () => {
    const el = canvas.value
    if (!el || !el.getContext('2d')) {
      failed.value = 'This browser cannot draw on a canvas.'
      return
    }
    try {
      const mod = await import('paper/dist/paper-core.js') as unknown as { default: paper.PaperScope }
      const s = new mod.default.PaperScope()
      s.setup(el)
      s.settings.insertItems = false
      scope.value = s
      observer = new ResizeObserver(() => {
        const b = box.value?.getBoundingClientRect()
        if (!b || !scope.value) return
        scope.value.view.viewSize = new s.Size(Math.max(b.width, 50), Math.max(b.height, 50))
        bump()
      })
      if (box.value) observer.observe(box.value)
      ready.value = true
    }
    catch (err: unknown) {
      failed.value = err instanceof Error ? err.message : 'The drawing could not start.'
    }
  })

  onBeforeUnmount(() => {
    observer?.disconnect()
    scope.value?.project.remove()
    scope.value = null
  })

  function zoomBy(factor: number, anchor?: { x: number; y: number }) {
    const s = scope.value
    if (!s) return
    const view = s.view
    const next = Math.min(Math.max(view.zoom * factor, 0.02), 60)
    const at = anchor ? view.viewToProject(new s.Point(anchor.x, anchor.y)) : view.center
    const real = next / view.zoom
    view.zoom = next
    view.center = at.add(view.center.subtract(at).divide(real))
    bump()
  }

  function panBy(dx: number, dy: number) {
    const s = scope.value
    if (!s) return
    s.view.center = s.view.center.subtract(new s.Point(dx, dy).divide(s.view.zoom))
    bump()
  }

  function fit(bounds: { minX: number; minY: number; maxX: number; maxY: number }, padding = 48) {
    const s = scope.value
    if (!s) return
    const size = s.view.viewSize
    const w = Math.max(bounds.maxX - bounds.minX, 1)
    const h = Math.max(bounds.maxY - bounds.minY, 1)
    s.view.zoom = Math.max(Math.min((size.width - 2 * padding) / w, (size.height - 2 * padding) / h), 0.02)
    s.view.center = new s.Point((bounds.minX + bounds.maxX) / 2, -(bounds.minY + bounds.maxY) / 2)
    bump()
  }

  function toPlate(clientX: number, clientY: number) {
    const s = scope.value
    const rect = canvas.value?.getBoundingClientRect()
    if (!s || !rect) return { x: 0, y: 0 }
    const p = s.view.viewToProject(new s.Point(clientX - rect.left, clientY - rect.top))
    return { x: p.x, y: -p.y }
  }

  return { scope, ready, failed, zoom, viewVersion, zoomBy, panBy, fit, toPlate }
}
