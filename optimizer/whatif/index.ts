// The trade-off explorer's engine, one surface for the server and the browser.
export * from './types';
export { runWhatIf, checkSettings, worstStatus } from './whatif';
export { recomputeMargin, applySettings, evaluateCheck } from './recompute';
export { defaultSettings, type ExplorerDefaults, type SettingKey, type SliderRange } from './settings';
export { twoLevelView, parseCoverText, karnaughLayout, grayCode, MAX_MAP_INPUTS, MAX_SIDE_BY_SIDE_INPUTS, type TwoLevelView, type TwoLevelRow } from './two-level';
export type { ChangedRegion, ExplorerData, ExplorerProposal, RegionDevice } from './explorer-data';
