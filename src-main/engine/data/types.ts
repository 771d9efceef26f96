// The shapes of a recordings import: column mapping, options, notices, per-run statistics, result.
import type { Recording } from '../types.ts';

/**
 * Which CSV columns hold what. Each entry is a header name (matched case-insensitively after
 * trimming) or a 1-based column number (a number, or a string of digits that names no column).
 */
export interface ColumnMapping {
  time: string | number;
  position: string | number;
  run?: string | number;
  input?: string | number;
  /** The position is an angle in radians (unwrapped on import); otherwise a displacement in metres. */
  angle?: boolean;
}

export interface ImportOptions {
  /** A time step above gapFactor x the run's median step is a gap: the run is split there. Default 1.5. */
  gapFactor?: number;
  /** Any other step deviating from the median step by more than this fraction is an error. Default 0.01. */
  irregularTolerance?: number;
  /** Fewest samples a run may have. Default 64. */
  minSamples?: number;
  /** Warn of clipping when at least this many consecutive samples sit at the run's min or max. Default 10. */
  clipSamples?: number;
  /** Warn of heavy quantization when the position spans fewer than this many levels. Default 256 (8 bits). */
  quantLevels?: number;
}

/** A fix applied or a warning raised, reported so nothing changes silently. */
export interface Notice {
  /** Machine-readable kind, e.g. 'gap-split', 'unwrapped', 'clipping', 'quantization'. */
  code: string;
  /** File as the caller named it. */
  file: string;
  /** Run name (as in Recording.runs[].name or the run before splitting). */
  run?: string;
  message: string;
}

export interface RunStats {
  name: string;
  file: string;
  samples: number;
  /** 1 / median time step (Hz). */
  sampleRate: number;
  /** Last time minus first time (s). */
  duration: number;
  /** Position range after unwrapping (rad or m). */
  min: number;
  max: number;
  /** Quantization step of the position channel when its samples lie on a common grid. */
  quantStep?: number;
  /** Lines of the file holding the first and last sample. */
  firstLine: number;
  lastLine: number;
}

/** Header names of the mapped columns (as written in the first file). */
export interface ChannelNames {
  time: string;
  position: string;
  input?: string;
  run?: string;
}

export interface ImportResult {
  recording: Recording;
  channels: ChannelNames;
  warnings: Notice[];
  fixes: Notice[];
  stats: RunStats[];
}

/** One file's share of an import, before the files are put together. */
export interface FileImport {
  file: string;
  channels: ChannelNames;
  runs: Recording['runs'];
  stats: RunStats[];
  warnings: Notice[];
  fixes: Notice[];
}
