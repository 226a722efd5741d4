// Whistle and cut candidates on footage: the Sync screen's "Find candidates" action.
export { scanFootage, scanFootageOnce, type ScanFootageOptions, type ScanFootageResult, type ScanProgress } from './scan-footage.ts';
export { storeCandidates, lastScan, scanMarkKey, type ScanMark, type StoreSummary } from './store-candidates.ts';
export { confirmNonLive, rejectNonLive } from './review-non-live.ts';
export { useFootageScan, type FootageScanState } from './useFootageScan.ts';
export { FindCandidates } from './FindCandidates.tsx';
