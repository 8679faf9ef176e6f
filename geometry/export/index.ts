// Exports: tiled full-size PDFs, cut files and their file names. Only the
// public surface is listed, so nothing here collides with the core's names.
export { PT_PER_MM, PT_PER_INCH, EXPORT_UNITS, formatShopLength, type ExportUnits } from './units'
export {
  PAPERS,
  PAPER_NAMES,
  MAX_PAGE_LENGTH,
  DEFAULT_MARGIN,
  DEFAULT_OVERLAP,
  tileContent,
  tilePlate,
  sheetTransform,
  plateToPage,
  pageSizePt,
  registrationPoints,
  polygonTouchesRect,
  sheetLabel,
  type PaperName,
  type PaperSpec,
  type Orientation,
  type Rect,
  type Sheet,
  type SheetNeighbours,
  type Tiling,
  type TilingOptions,
  type PlateTilingOptions,
  type TileContent,
  type SheetTransform,
} from './tiling'
export {
  guideLine,
  guidePattern,
  guideOffset,
  routedOpenings,
  GUIDE_TOLERANCE,
  type GuideOptions,
  type GuidePattern,
  type UnreachableRun,
} from './guide-line'
export {
  PLATE_LAYERS,
  PLATE_LAYER_LABEL,
  PLATE_LAYER_SUFFIX,
  MirrorRabbetError,
  OPENING_CUTS,
  OPENING_CUT_LABEL,
  type OpeningCut,
  type PlateLayer,
} from './layers'
export {
  buildCutDrawing,
  rabbetLayerName,
  LAYER_OUTSIDE,
  LAYER_INSIDE,
  LAYER_RABBET_PREFIX,
  LAYER_DRILL,
  LAYER_REFERENCE,
  LAYER_NOTES,
  LAYER_HOLESAW_PREFIX,
  holeSawLayerName,
  OUTLINE_CHORD_ERROR,
  type CutOptions,
  type CutDrawing,
  type CutLayer,
  type CutEntity,
  type LayerRole,
} from './cut-layers'
export { renderCutDxf, type DxfOptions, type CutFileMeta } from './dxf'
export { SAVED_WITH_ERRORS, savedErrors, savedErrorsLine, piecesFor, cutListLines, holeListLines, type PieceCount } from './plate-notes'
export { renderCutSvg, type SvgOptions } from './svg'
export { exportFileName, slugify, type ExportFileMeta } from './filename'
export { TEMPLATE_FONT_FILE, resolveFontBytes, type FontBytes } from './fonts'
export type { TemplateMeta, LegendEntry, TiledDrawing } from './tiled-pdf'
export {
  renderTemplatePdf,
  planTemplate,
  bushingOffset,
  UNREACHABLE_LABEL,
  TEMPLATE_STYLES,
  type TemplateOptions,
  type BushingOptions,
  type PlateTemplate,
} from './template-pdf'
export {
  renderTubeWrapPdf,
  planTubeWrap,
  tubeWrapLayout,
  type TubeWrapOptions,
  type TubeWrapLayout,
  type WrapNotch,
  type TubeWrap,
} from './tube-wrap-pdf'
export { renderBuildSheetPdf, chooseScale, scaleLabel, type BuildSheetOptions, type BuildSheetMeta } from './build-sheet-pdf'
export { withExtraMarks, type ExtraMarks } from './extra-marks'
export { plateStationMarks, wrapStripMarks } from './skirt-marks'
export { renderSkirtProfilesPdf, planSkirtProfiles, skirtProfileLayout, type SkirtProfileOptions, type ProfileRib } from './skirt-profiles-pdf'
