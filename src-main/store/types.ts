// Shapes of what a project holds. Recordings use the engine's Recording/Run types; models,
// designs and trials are JSON documents owned (and validated in depth) by their engines.
import type { Recording } from '../engine/types.ts';
import type { JsonObject, JsonValue } from './json-document.ts';

/** One imported recording with what the importer knew and did. */
export interface RecordingEntry {
  /** Unique within the project, e.g. "swing-a". */
  name: string;
  /** File name the recording was imported from ('' when simulated). */
  sourceFile: string;
  /** Channel (column) names as imported, e.g. ["time", "theta", "torque"]. */
  channels: string[];
  /** One unit per channel, e.g. ["s", "rad", "N m"] ('' when unknown). */
  units: string[];
  /** The import settings used (delimiter, columns, unwrap, ...): a JSON object. */
  importSettings: JsonObject;
  /** Warnings raised and fixes applied on import: a JSON array. */
  warnings: JsonValue[];
  /** The samples, split into runs. */
  recording: Recording;
}

/** An energy model or a controller design: an opaque JSON document with a kind and a name. */
export interface DocumentEntry {
  /** Unique within its collection. */
  name: string;
  /** What the document is, e.g. "koopman-energy" or "level-hold"; [A-Za-z0-9][A-Za-z0-9._-]*. */
  kind: string;
  body: JsonObject;
}

/** One sampled signal of a trial. */
export interface Trace {
  name: string;
  /** '' when unitless or unknown. */
  unit: string;
  data: Float64Array;
}

/** A simulated (or hardware) trial: its settings, the metrics it scored, and its traces. */
export interface TrialEntry {
  name: string;
  kind: string;
  settings: JsonObject;
  metrics: JsonObject;
  traces: Trace[];
}

/** A free-text note. */
export interface NoteEntry {
  name: string;
  text: string;
}

/** Who saved the file and when. */
export interface ProjectInfo {
  /** Version of the Ergostat build that last saved the project. */
  appVersion: string;
  /** ISO 8601 UTC, set when the project was created. */
  createdAt: string;
  /** ISO 8601 UTC, set by each save. */
  modifiedAt: string;
}
