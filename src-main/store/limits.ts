// Size limits for project files. A file from someone else is untrusted, so every size is
// bounded before anything is read into memory. The defaults are documented in
// docs/project-file.md; callers may pass tighter (or, knowingly, looser) limits.

export interface ProjectLimits {
  /** Whole file, bytes (default 2 GiB). */
  maxFileBytes: number;
  /** One sample blob (t, q, u or a trial trace), bytes (default 512 MiB = 67,108,864 samples). */
  maxBlobBytes: number;
  /** One JSON document (settings, model, design, metrics, ...), bytes of UTF-8 (default 16 MiB). */
  maxJsonBytes: number;
  /** Nesting depth of a JSON document (default 64). */
  maxJsonDepth: number;
  /** One note's text, bytes of UTF-8 (default 16 MiB). */
  maxNoteBytes: number;
  /** A name, kind, source or channel string, UTF-16 code units (default 1024). */
  maxNameLength: number;
  /** Recordings per project (default 10,000). */
  maxRecordings: number;
  /** Runs in one recording (default 10,000). */
  maxRunsPerRecording: number;
  /** Rows of each of models, designs, trials, notes (default 10,000). */
  maxDocuments: number;
  /** Traces in one trial (default 256). */
  maxTracesPerTrial: number;
  /** Channel names (and units) of one recording (default 256). */
  maxChannels: number;
}

export const DEFAULT_LIMITS: Readonly<ProjectLimits> = Object.freeze({
  maxFileBytes: 2 * 1024 ** 3,
  maxBlobBytes: 512 * 1024 ** 2,
  maxJsonBytes: 16 * 1024 ** 2,
  maxJsonDepth: 64,
  maxNoteBytes: 16 * 1024 ** 2,
  maxNameLength: 1024,
  maxRecordings: 10_000,
  maxRunsPerRecording: 10_000,
  maxDocuments: 10_000,
  maxTracesPerTrial: 256,
  maxChannels: 256,
});

/** Defaults overridden by `partial`; every given value must be a positive integer. */
export function resolveLimits(partial: Partial<ProjectLimits> | undefined): ProjectLimits {
  const out: ProjectLimits = { ...DEFAULT_LIMITS };
  if (partial === undefined) return out;
  if (partial === null || typeof partial !== 'object') throw new TypeError('limits: expected an object of positive integers');
  for (const [key, value] of Object.entries(partial)) {
    if (!(key in DEFAULT_LIMITS)) throw new TypeError(`limits.${key}: unknown limit (known: ${Object.keys(DEFAULT_LIMITS).join(', ')})`);
    if (value === undefined) continue;
    if (typeof value !== 'number' || !Number.isSafeInteger(value) || value <= 0) {
      throw new TypeError(`limits.${key}: expected a positive integer, got ${String(value)}`);
    }
    out[key as keyof ProjectLimits] = value;
  }
  return out;
}
