// Public face of src-main/export: the controller as C99 (c/), JSON and CSV, plots (plots/) and the report.
export * from './c/index.ts';
export { prettyJson, type JsonExport } from './json.ts';
export { traceToCsv, traceFromCsv } from './csv.ts';
export { buildReport, type ReportInput, type ReportTrial, type RecordingsSummary } from './report.ts';
export { escapeHtml } from './html.ts';
export * from './plots/index.ts';
