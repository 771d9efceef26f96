// Public face of export/c: the controller as portable C99 with its check program.
export { exportC, type ExportCResult, type ExportCOptions, type ExportedFile } from './export-c.ts';
export { checkCName, MAX_NAME_LENGTH } from './identifier.ts';
export { computeVectors, type VectorOptions, type VectorTable } from './vectors.ts';
export { CHECK_TOLERANCE, CHECK_FLOOR_FRACTION } from './check-source.ts';
export { cDouble, commentText } from './literal.ts';
