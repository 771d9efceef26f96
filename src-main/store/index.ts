// The project file: one self-contained SQLite file per project (.ergostat). See docs/project-file.md.
export { ProjectStore, APP_VERSION, type OpenReport, type CreateOptions } from './project.ts';
export { openProject, type OpenOptions } from './open.ts';
export { ProjectFileError } from './errors.ts';
export { Collection } from './collection.ts';
export { DEFAULT_LIMITS, type ProjectLimits } from './limits.ts';
export { PROJECT_EXTENSION, saveLeftovers, type SaveOptions, type SaveReport } from './save.ts';
export { SCHEMA_VERSION, OLDEST_READABLE_SCHEMA, APPLICATION_ID } from './schema.ts';
export type { JsonValue, JsonObject } from './json-document.ts';
export type { RecordingEntry, DocumentEntry, TrialEntry, Trace, NoteEntry, ProjectInfo } from './types.ts';
