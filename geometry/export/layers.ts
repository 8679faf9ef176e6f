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
