export { skirtSchema, SKIRT_PROFILES } from './settings'
export type { SkirtSettings, SkirtSettingsInput, SkirtProfile } from './settings'
export { skirtStrips, skirtCutList, skirtTotals, cutStep, profilePoints, profileLength, resolveSkirt } from './strips'
export type { SkirtStrip, SkirtResult, SkirtOptions, CutListRow, SkirtTotals } from './strips'
