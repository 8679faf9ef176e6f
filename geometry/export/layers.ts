// Which layer of a two-layer plate a file is for. The top layer carries the
// rabbets the pan rims sit in; the bottom layer has none; both carry the centre
// and index holes so the layers and the pattern register on each other. No
// dependencies: the export panel imports this in the browser.

export const PLATE_LAYERS = ['top', 'bottom', 'all'] as const
export type PlateLayer = (typeof PLATE_LAYERS)[number]

/** Words for titles and notes. */
export const PLATE_LAYER_LABEL: Record<PlateLayer, string> = {
  top: 'top layer (with rabbets)',
  bottom: 'bottom layer (no rabbets)',
  all: 'both layers',
}

/** The part a file name gets, e.g. `oak-r3-top.dxf`; none for both layers in one file. */
export const PLATE_LAYER_SUFFIX: Record<PlateLayer, string> = {
  top: '-top',
  bottom: '-bottom',
  all: '',
}

export function assertPlateLayer(layer: unknown): asserts layer is PlateLayer {
  if (!(PLATE_LAYERS as readonly unknown[]).includes(layer)) {
    throw new RangeError(`Unknown layer "${String(layer)}": use one of ${PLATE_LAYERS.join(', ')}.`)
  }
}

/** Thrown when a mirrored file would put a rabbet on the face the machine cannot reach. */
export class MirrorRabbetError extends RangeError {
  readonly field = 'mirror'
  constructor() {
    super(
      'A mirrored file is cut from the back face, so its rabbets would land on the face the machine cannot reach: mirror only the bottom layer (it has no rabbets), or cut the top layer face up.',
    )
    this.name = 'MirrorRabbetError'
  }
}

/**
 * How the pockets and access openings go into a cut file: `routed`, inside
 * profiles on the inside-cut layer (a CNC router cuts them, the default), or
 * `hole-saw`, a pilot on the drill layer and the saw's circle on a layer
 * never cut that names the saw (a hand shop). Openings past the largest hole
 * saw are routed either way.
 */
export const OPENING_CUTS = ['routed', 'hole-saw'] as const
export type OpeningCut = (typeof OPENING_CUTS)[number]

export const OPENING_CUT_LABEL: Record<OpeningCut, string> = {
  routed: 'routed as inside profiles (CNC)',
  'hole-saw': 'hole-saw marks with pilots (hand shop)',
}

export function assertOpeningCut(openings: unknown): asserts openings is OpeningCut {
  if (!(OPENING_CUTS as readonly unknown[]).includes(openings)) {
    throw new RangeError(`Unknown way to cut the openings "${String(openings)}": use one of ${OPENING_CUTS.join(', ')}.`)
  }
}
