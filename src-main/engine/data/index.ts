// Recordings data: parsing and validation of CSV recordings (pure; the file streaming side is
// src-main/recordings/).
export { DataError, type ColumnRef } from './data-error.ts';
export type { ColumnMapping, ImportOptions, Notice, RunStats, ChannelNames, ImportResult, FileImport } from './types.ts';
export { DEFAULT_OPTIONS, checkMapping, resolveOptions, type ResolvedOptions } from './options.ts';
export { CsvStreamParser } from './csv-stream.ts';
export { parseCsvText } from './parse-csv-text.ts';
export { assembleImport, displayNames } from './assemble.ts';
export { parseNumberText, scanNumber, numberScan, NUM_OK, NUM_MISSING, NUM_INVALID, type NumberScan } from './parse-number.ts';
export { unwrapAngle, type Unwrapped } from './unwrap.ts';
export { estimateQuantization, type Quantization } from './quantization.ts';
export { findClipping, type Clipping, type ClipSide } from './clipping.ts';
export { median, selectInPlace } from './median.ts';
export { BlockPool, GrowableF64 } from './growable-f64.ts';
