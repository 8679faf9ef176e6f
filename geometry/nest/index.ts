// Nesting plates on plywood sheets: the shape nester (nestParts, the fixed
// name) and the sheet plan built on it. The layout PDF and DXF writers live in
// ./layout-pdf and ./layout-dxf (pdf-lib and dxf-writer; import ./nest or ./plan
// directly where those are not wanted).
export {
  nestParts,
  nestWithState,
  nestSteps,
  drain,
  drainAsync,
  PartTooLargeError,
  NestTimeoutError,
  type NestPartInput,
  type NestSheetInput,
  type NestOptions,
  type PlacedPart,
  type NestedSheet,
  type NestResult,
  type Nesting,
  type NestStep,
} from './nest'
export {
  improveSteps,
  improveNesting,
  scoreLayout,
  betterScore,
  type ImproveOptions,
  type ImproveProgress,
  type ImprovedLayout,
  type LayoutScore,
} from './improve'
export {
  planSheets,
  planSheetsAsync,
  planSteps,
  PlatePlanTooLargeError,
  WORKFLOWS,
  DEFAULT_GLUE_FILM,
  OFFCUT_LEAST,
  type Workflow,
  type PartLayer,
  type PlanEntry,
  type PlanSheet,
  type PlanSettings,
  type PlanPart,
  type PlanLayout,
  type SheetPlan,
} from './plan'
export { renderLayoutDxf, LAYER_SHEET, type LayoutDxfOptions } from './layout-dxf'
export { renderLayoutPdf, partLabel, type LayoutPdfOptions } from './layout-pdf'
