// Recordings from disk: streaming CSV import (the parsing and checks live in engine/data).
export { importRecordings, type StreamOptions } from './import-recordings.ts';
export { DataError, parseCsvText, type ColumnMapping, type ImportOptions, type ImportResult, type Notice, type RunStats } from '../engine/data/index.ts';
