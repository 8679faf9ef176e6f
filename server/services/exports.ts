import { z } from 'zod'
import { buildPlate, plateParamsSchema, type Plate } from '../../geometry'
import { skirtMarks } from './skirt'
import {
  renderTemplatePdf, renderTubeWrapPdf, renderCutDxf, renderCutSvg, exportFileName, PAPER_NAMES,
  PLATE_LAYERS, PLATE_LAYER_SUFFIX, MirrorRabbetError, OPENING_CUTS,
  type PaperName, type FontBytes, type PlateLayer,
} from '../../geometry/export'
import { invalid } from '../utils/validation'

// Query options of the export routes. Lengths arrive in mm; every bound is a
// real one (a printer margin over 30 mm or an overlap over 50 mm is a typo).
const flag = z.enum(['true', 'false', '1', '0']).transform(v => v === 'true' || v === '1')
const mm = (max: number) => z.coerce.number({ error: 'Must be a number of millimetres' }).min(0, 'Must not be negative').max(max, `Must be at most ${max} mm`)
const paper = z.enum(PAPER_NAMES as [PaperName, ...PaperName[]], { error: `Paper must be one of: ${PAPER_NAMES.join(', ')}` })
const units = z.enum(['in', 'mm'], { error: 'Units must be in or mm' })
const layer = z.enum(PLATE_LAYERS, { error: `Layer must be one of: ${PLATE_LAYERS.join(', ')}` }).default('all')

export const templateQuerySchema = z.object({
  paper: paper.default('letter'),
  orientation: z.enum(['auto', 'portrait', 'landscape'], { error: 'Orientation must be auto, portrait or landscape' }).default('auto'),
  overlap: mm(50).optional(),
  margin: mm(30).optional(),
  units: units.default('in'),
  bushing: mm(60).optional(),
  bit: mm(50).optional(),
  layer,
}).superRefine((q, ctx) => {
  if ((q.bushing === undefined) !== (q.bit === undefined)) {
    ctx.addIssue({ code: 'custom', path: [q.bushing === undefined ? 'bushing' : 'bit'], message: 'Give both the bushing and the bit diameter, or neither' })
  }
  else if (q.bushing !== undefined && q.bit !== undefined && q.bushing <= q.bit) {
    ctx.addIssue({ code: 'custom', path: ['bushing'], message: 'The guide bushing must be wider than the bit' })
  }
})

export const tubeWrapQuerySchema = z.object({
  paper: paper.default('letter'),
  orientation: z.enum(['auto', 'portrait', 'landscape']).default('auto'),
  overlap: mm(50).optional(),
  margin: mm(30).optional(),
  units: units.default('in'),
  height: mm(600).pipe(z.number().min(25, 'The strip must be at least 25 mm tall')).optional(),
})

/** Pockets and openings routed as inside profiles (CNC, the default) or marked for a hole saw with pilots (hand shop). */
export const openingsField = z.enum(OPENING_CUTS, { error: `Openings must be one of: ${OPENING_CUTS.join(', ')}` }).default('routed')

export const cutQuerySchema = z.object({
  units: units.default('in'),
  reference: flag.default(true),
  mirror: flag.default(false),
  layer,
  openings: openingsField,
})

export interface RevisionForExport {
  number: number
  params: unknown
  designName: string
  sizeLabel: string | null
  createdAt: Date
}

export type PlateResult = { ok: true; plate: Plate } | { ok: false; fields: Record<string, string> }

/** Rebuilds the plate from stored params: the server never trusts a computed plate. */
export function plateFromRevision(revision: RevisionForExport): PlateResult {
  const parsed = plateParamsSchema.safeParse(revision.params)
  if (!parsed.success) {
    return { ok: false, fields: Object.fromEntries(parsed.error.issues.map(i => [`params.${i.path.join('.')}`, i.message])) }
  }
  return { ok: true, plate: buildPlate(parsed.data) }
}

function meta(revision: RevisionForExport) {
  return {
    designName: revision.designName,
    sizeLabel: revision.sizeLabel ?? undefined,
    revision: revision.number,
    date: revision.createdAt.toISOString().slice(0, 10),
  }
}

/** `oak-medium-r3.dxf`, or `oak-medium-r3-bottom.dxf` for one layer of the plate. */
export function fileName(revision: RevisionForExport, ext: string, plateLayer: PlateLayer = 'all'): string {
  const name = exportFileName({ designName: revision.designName, sizeLabel: revision.sizeLabel ?? undefined, revision: revision.number }, ext)
  const suffix = PLATE_LAYER_SUFFIX[plateLayer]
  return suffix ? name.replace(/(\.[a-z]+)$/, `${suffix}$1`) : name
}

export function templatePdf(plate: Plate, revision: RevisionForExport, q: z.output<typeof templateQuerySchema>, font: FontBytes) {
  return renderTemplatePdf(plate, {
    paper: q.paper,
    orientation: q.orientation,
    overlap: q.overlap,
    margin: q.margin,
    units: q.units,
    bushing: q.bushing !== undefined && q.bit !== undefined ? { bushingDiameter: q.bushing, bitDiameter: q.bit } : undefined,
    layer: q.layer,
    meta: meta(revision),
    font,
    extraMarks: skirtMarks(plate).plate,
  })
}

export function tubeWrapPdf(plate: Plate, revision: RevisionForExport, q: z.output<typeof tubeWrapQuerySchema>, font: FontBytes) {
  return renderTubeWrapPdf(plate, { paper: q.paper, orientation: q.orientation, overlap: q.overlap, margin: q.margin, units: q.units, height: q.height, meta: meta(revision), font, extraMarks: skirtMarks(plate, q.height, q.units).wrap })
}

/** A refusal that depends on the plate, not only on the query: a 422 on the field that asked for it. */
function refuseMirroredRabbets<T>(write: () => T): T {
  try {
    return write()
  }
  catch (err: unknown) {
    if (err instanceof MirrorRabbetError) invalid({ [err.field]: err.message }, 'This file cannot be mirrored')
    throw err
  }
}

/** `revision` names the design on the file's notes layer; without it the notes say only what the plate shows. */
export function cutDxf(plate: Plate, q: z.output<typeof cutQuerySchema>, revision?: RevisionForExport): string {
  const meta = revision ? { designName: revision.designName, sizeLabel: revision.sizeLabel ?? undefined, revision: revision.number } : undefined
  return refuseMirroredRabbets(() => renderCutDxf(plate, { units: q.units, includeReference: q.reference, mirror: q.mirror, layer: q.layer, openings: q.openings, meta }))
}

export function cutSvg(plate: Plate, q: z.output<typeof cutQuerySchema>): string {
  return refuseMirroredRabbets(() => renderCutSvg(plate, { units: q.units, includeReference: q.reference, mirror: q.mirror, layer: q.layer, openings: q.openings }))
}
