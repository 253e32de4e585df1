import { lazy } from 'react';

// Each tab's code is its own chunk, fetched when the tab first opens, so the revision page's
// first load carries only the header, the workflow bar and the tab strip (issue 12: first-load
// JavaScript ≤ 150 kB gzipped). The charts (recharts) and the editors come with their tabs.
export const TAB_CODE = {
  bondingEditor: () => import('../editor/BondingEditor'),
  exposureEditor: () => import('../editor/ExposureEditor'),
  jsonEditor: () => import('../editor/JsonInputsEditor'),
  results: () => import('./ResultsTab'),
  checklist: () => import('./ChecklistTab'),
  remarks: () => import('./RemarksTab'),
  checkValues: () => import('./CheckValuesTab'),
  files: () => import('./FilesTab'),
  history: () => import('./HistoryTab'),
  explore: () => import('../explore/ExploreTab'),
};

export const BondingEditor = lazy(TAB_CODE.bondingEditor);
export const ExposureEditor = lazy(TAB_CODE.exposureEditor);
export const JsonInputsEditor = lazy(TAB_CODE.jsonEditor);
export const ResultsTab = lazy(TAB_CODE.results);
export const ChecklistTab = lazy(TAB_CODE.checklist);
export const RemarksTab = lazy(TAB_CODE.remarks);
export const CheckValuesTab = lazy(TAB_CODE.checkValues);
export const FilesTab = lazy(TAB_CODE.files);
export const HistoryTab = lazy(TAB_CODE.history);
export const ExploreTab = lazy(TAB_CODE.explore);
