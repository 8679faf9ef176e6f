// Extra marks a feature adds to a template writer without the writer knowing
// the feature: drawn after the writer's own body in the same full-size user
// space (1 mm), with their own legend lines and cover notes.
import type { Ops } from './pdf-ops'
import type { LegendEntry } from './tiled-pdf'

export interface ExtraMarks {
  draw(ops: Ops): void
  legend?: LegendEntry[]
  notes?: string[]
}

/** Merges extra marks into a drawing's body, legend and notes. */
export function withExtraMarks<T extends { drawBody(ops: Ops): void; legend: LegendEntry[]; notes: string[] }>(drawing: T, extra: readonly ExtraMarks[] | undefined): T {
  if (!extra?.length) return drawing
  const body = drawing.drawBody
  return {
    ...drawing,
    drawBody: (ops: Ops) => {
      body(ops)
      for (const m of extra) m.draw(ops)
    },
    legend: [...drawing.legend, ...extra.flatMap((m) => m.legend ?? [])],
    notes: [...drawing.notes, ...extra.flatMap((m) => m.notes ?? [])],
  }
}
