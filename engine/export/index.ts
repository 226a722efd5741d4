/** Pure export builders: corrected event log (CSV, JSON), clock fits (JSON), sync report (HTML). */
export * from './corrected-events.ts';
export * from './clock-fits.ts';
export * from './sync-report.ts';
