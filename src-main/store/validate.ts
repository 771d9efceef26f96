// Door checks for everything that enters a project, whether from the app (put) or from a file
// (open). Each returns a deep copy, so the store never shares arrays or objects with callers,
// and throws an Error whose message starts with the path of the bad field.
import type { Run } from '../engine/types.ts';
import { cloneJson, toJsonText, type JsonObject, type JsonValue } from './json-document.ts';
import type { ProjectLimits } from './limits.ts';
import type { DocumentEntry, NoteEntry, RecordingEntry, Trace, TrialEntry } from './types.ts';

const KIND = /^[A-Za-z0-9][A-Za-z0-9._-]*$/;

export function checkName(v: unknown, where: string, limits: ProjectLimits, allowEmpty = false): string {
  if (typeof v !== 'string') throw new Error(`${where}: expected a string, got ${v === null ? 'null' : typeof v}`);
  if (!allowEmpty && v.length === 0) throw new Error(`${where}: must not be empty`);
  if (v.length > limits.maxNameLength) throw new Error(`${where}: ${v.length} characters, over the limit of ${limits.maxNameLength}`);
  return v;
}

export function checkKind(v: unknown, where: string, limits: ProjectLimits): string {
  const s = checkName(v, where, limits);
  if (!KIND.test(s)) throw new Error(`${where}: "${s}" is not a kind (letters, digits, '.', '_', '-'; starting with a letter or digit)`);
  return s;
}

function checkObject(v: unknown, where: string, limits: ProjectLimits): JsonObject {
  toJsonText(v, 'object', limits.maxJsonDepth, limits.maxJsonBytes, where);
  return cloneJson(v as JsonObject);
}

function checkArray(v: unknown, where: string, limits: ProjectLimits): JsonValue[] {
  toJsonText(v, 'array', limits.maxJsonDepth, limits.maxJsonBytes, where);
  return cloneJson(v as JsonValue[]);
}

function checkSamples(v: unknown, where: string, limits: ProjectLimits, copy = true): Float64Array {
  if (!(v instanceof Float64Array)) throw new Error(`${where}: expected a Float64Array`);
  if (v.byteLength > limits.maxBlobBytes) throw new Error(`${where}: ${v.byteLength} bytes of samples, over the limit of ${limits.maxBlobBytes}`);
  return copy ? v.slice() : v;
}

function checkStrings(v: unknown, where: string, limits: ProjectLimits): string[] {
  if (!Array.isArray(v)) throw new Error(`${where}: expected an array of strings`);
  if (v.length > limits.maxChannels) throw new Error(`${where}: ${v.length} entries, over the limit of ${limits.maxChannels}`);
  return v.map((s, i) => checkName(s, `${where}[${i}]`, limits, true));
}

/**
 * A Run as engine/types.ts defines it: t, q (and u) of one length >= 1, t finite and strictly
 * increasing. `copy = false` keeps the given arrays (for freshly decoded file data only).
 */
export function checkRun(v: unknown, where: string, limits: ProjectLimits, copy = true): Run {
  if (v === null || typeof v !== 'object') throw new Error(`${where}: expected a run object`);
  const r = v as Record<string, unknown>;
  const name = checkName(r.name, `${where}.name`, limits, true);
  const source = checkName(r.source, `${where}.source`, limits, true);
  const t = checkSamples(r.t, `${where}.t`, limits, copy);
  const q = checkSamples(r.q, `${where}.q`, limits, copy);
  if (t.length === 0) throw new Error(`${where}.t: a run needs at least one sample`);
  if (q.length !== t.length) throw new Error(`${where}.q: ${q.length} samples, but t has ${t.length}`);
  for (let i = 0; i < t.length; i++) {
    if (!Number.isFinite(t[i])) throw new Error(`${where}.t[${i}]: time must be finite, got ${t[i]}`);
    if (i > 0 && !(t[i] > t[i - 1])) throw new Error(`${where}.t[${i}]: time must be strictly increasing (${t[i - 1]} then ${t[i]})`);
  }
  const run: Run = { name, source, t, q };
  if (r.u !== undefined) {
    const u = checkSamples(r.u, `${where}.u`, limits, copy);
    if (u.length !== t.length) throw new Error(`${where}.u: ${u.length} samples, but t has ${t.length}`);
    run.u = u;
  }
  return run;
}

export function checkRecordingEntry(v: unknown, where: string, limits: ProjectLimits): RecordingEntry {
  if (v === null || typeof v !== 'object') throw new Error(`${where}: expected a recording entry object`);
  const e = v as Record<string, unknown>;
  const name = checkName(e.name, `${where}.name`, limits);
  const sourceFile = checkName(e.sourceFile, `${where}.sourceFile`, limits, true);
  const channels = checkStrings(e.channels, `${where}.channels`, limits);
  const units = checkStrings(e.units, `${where}.units`, limits);
  if (units.length !== channels.length) throw new Error(`${where}.units: ${units.length} units for ${channels.length} channels`);
  const importSettings = checkObject(e.importSettings, `${where}.importSettings`, limits);
  const warnings = checkArray(e.warnings, `${where}.warnings`, limits);
  const rec = e.recording as Record<string, unknown> | null | undefined;
  if (rec === null || typeof rec !== 'object') throw new Error(`${where}.recording: expected a Recording object`);
  if (rec.coordinate !== 'angle' && rec.coordinate !== 'linear') {
    throw new Error(`${where}.recording.coordinate: expected 'angle' or 'linear', got ${JSON.stringify(rec.coordinate)}`);
  }
  if (!Array.isArray(rec.runs)) throw new Error(`${where}.recording.runs: expected an array of runs`);
  if (rec.runs.length === 0) throw new Error(`${where}.recording.runs: a recording needs at least one run`);
  if (rec.runs.length > limits.maxRunsPerRecording) {
    throw new Error(`${where}.recording.runs: ${rec.runs.length} runs, over the limit of ${limits.maxRunsPerRecording}`);
  }
  const runs = rec.runs.map((r, i) => checkRun(r, `${where}.recording.runs[${i}]`, limits));
  return { name, sourceFile, channels, units, importSettings, warnings, recording: { coordinate: rec.coordinate, runs } };
}

export function checkDocumentEntry(v: unknown, where: string, limits: ProjectLimits): DocumentEntry {
  if (v === null || typeof v !== 'object') throw new Error(`${where}: expected a document entry object`);
  const e = v as Record<string, unknown>;
  return {
    name: checkName(e.name, `${where}.name`, limits),
    kind: checkKind(e.kind, `${where}.kind`, limits),
    body: checkObject(e.body, `${where}.body`, limits),
  };
}

export function checkTrace(v: unknown, where: string, limits: ProjectLimits): Trace {
  if (v === null || typeof v !== 'object') throw new Error(`${where}: expected a trace object`);
  const e = v as Record<string, unknown>;
  return {
    name: checkName(e.name, `${where}.name`, limits),
    unit: checkName(e.unit, `${where}.unit`, limits, true),
    data: checkSamples(e.data, `${where}.data`, limits),
  };
}

export function checkTrialEntry(v: unknown, where: string, limits: ProjectLimits): TrialEntry {
  if (v === null || typeof v !== 'object') throw new Error(`${where}: expected a trial entry object`);
  const e = v as Record<string, unknown>;
  const name = checkName(e.name, `${where}.name`, limits);
  const kind = checkKind(e.kind, `${where}.kind`, limits);
  const settings = checkObject(e.settings, `${where}.settings`, limits);
  const metrics = checkObject(e.metrics, `${where}.metrics`, limits);
  if (!Array.isArray(e.traces)) throw new Error(`${where}.traces: expected an array of traces`);
  if (e.traces.length > limits.maxTracesPerTrial) {
    throw new Error(`${where}.traces: ${e.traces.length} traces, over the limit of ${limits.maxTracesPerTrial}`);
  }
  const traces = e.traces.map((t, i) => checkTrace(t, `${where}.traces[${i}]`, limits));
  const seen = new Set<string>();
  for (const [i, t] of traces.entries()) {
    if (seen.has(t.name)) throw new Error(`${where}.traces[${i}].name: "${t.name}" is used twice in this trial`);
    seen.add(t.name);
  }
  return { name, kind, settings, metrics, traces };
}

export function checkNoteEntry(v: unknown, where: string, limits: ProjectLimits): NoteEntry {
  if (v === null || typeof v !== 'object') throw new Error(`${where}: expected a note object`);
  const e = v as Record<string, unknown>;
  const name = checkName(e.name, `${where}.name`, limits);
  if (typeof e.text !== 'string') throw new Error(`${where}.text: expected a string`);
  const bytes = Buffer.byteLength(e.text, 'utf8');
  if (bytes > limits.maxNoteBytes) throw new Error(`${where}.text: ${bytes} bytes, over the limit of ${limits.maxNoteBytes}`);
  return { name, text: e.text };
}

/** Deep copies for handing entries out (arrays are copied; JSON is cloned). */
export function copyRecordingEntry(e: RecordingEntry): RecordingEntry {
  return {
    ...e,
    channels: [...e.channels],
    units: [...e.units],
    importSettings: cloneJson(e.importSettings),
    warnings: cloneJson(e.warnings),
    recording: {
      coordinate: e.recording.coordinate,
      runs: e.recording.runs.map((r) => {
        const c: Run = { name: r.name, source: r.source, t: r.t.slice(), q: r.q.slice() };
        if (r.u) c.u = r.u.slice();
        return c;
      }),
    },
  };
}

export function copyDocumentEntry(e: DocumentEntry): DocumentEntry {
  return { name: e.name, kind: e.kind, body: cloneJson(e.body) };
}

export function copyTrialEntry(e: TrialEntry): TrialEntry {
  return {
    name: e.name,
    kind: e.kind,
    settings: cloneJson(e.settings),
    metrics: cloneJson(e.metrics),
    traces: e.traces.map((t) => ({ name: t.name, unit: t.unit, data: t.data.slice() })),
  };
}

export function copyNoteEntry(e: NoteEntry): NoteEntry {
  return { name: e.name, text: e.text };
}
