// The open project as the app holds it: a ProjectStore in memory, the path it came from and
// whether it has unsaved changes. One Workspace serves one window (or one bridge).
import { basename, extname } from 'node:path';
import { ProjectStore, openProject, type RecordingEntry } from '../store/index.ts';
import type { ColumnMapping, ImportResult, Notice } from '../recordings/index.ts';
import type { ProjectSummary, RecordingSummary } from './results.ts';

function isNotice(x: unknown): x is Notice & { kind?: string } {
  return typeof x === 'object' && x !== null && typeof (x as Notice).message === 'string';
}

// Summaries scan every sample once per stored entry: cached by the entry object the store holds
// (peek/peekAll return it unchanged until the entry is replaced), since project.state runs after
// every operation and recordings can hold millions of samples.
const summaryCache = new WeakMap<object, RecordingSummary>();

function cachedSummary(e: Readonly<RecordingEntry>): RecordingSummary {
  let s = summaryCache.get(e);
  if (!s) {
    s = summarizeRecording(e);
    summaryCache.set(e, s);
  }
  return s;
}

export function summarizeRecording(e: Readonly<RecordingEntry>): RecordingSummary {
  const runs = e.recording.runs.map((r) => {
    const n = r.t.length;
    const duration = n > 1 ? r.t[n - 1] - r.t[0] : 0;
    let min = Infinity;
    let max = -Infinity;
    for (let i = 0; i < n; i++) {
      const q = r.q[i];
      if (q < min) min = q;
      if (q > max) max = q;
    }
    return { name: r.name, samples: n, sampleRate: duration > 0 ? (n - 1) / duration : 0, duration, min, max };
  });
  const notices = (e.warnings as unknown[]).filter(isNotice) as (Notice & { kind?: string })[];
  return {
    name: e.name,
    sourceFile: e.sourceFile,
    coordinate: e.recording.coordinate,
    runs,
    warnings: notices.filter((n) => n.kind !== 'fix').map((n) => n.message),
    fixes: notices.filter((n) => n.kind === 'fix').map((n) => n.message),
  };
}

export class Workspace {
  store: ProjectStore = ProjectStore.create();
  path: string | null = null;
  dirty = false;

  summary(): ProjectSummary {
    const docs = (c: ProjectStore["models"]) => c.peekAll().map((d) => ({ name: d.name, kind: d.kind }));
    return {
      path: this.path,
      dirty: this.dirty,
      recordings: this.store.recordings.peekAll().map(cachedSummary),
      models: docs(this.store.models),
      designs: docs(this.store.designs),
      trials: this.store.trials.peekAll().map((t) => ({ name: t.name, kind: t.kind })),
    };
  }

  reset(): void {
    this.store = ProjectStore.create();
    this.path = null;
    this.dirty = false;
  }

  open(path: string): void {
    const store = openProject(path);
    this.store = store;
    this.path = path;
    this.dirty = false;
  }

  save(path?: string): void {
    const target = path ?? this.path;
    if (!target) throw new Error('project.save: the project has no file yet; give a path');
    this.store.save(target);
    this.path = target;
    this.dirty = false;
  }

  /** A name not yet used in a collection: base, base-2, base-3, ... */
  uniqueName(taken: (n: string) => boolean, base: string): string {
    const clean = base.replace(/[^A-Za-z0-9._ -]/g, '_').slice(0, 120) || 'recording';
    if (!taken(clean)) return clean;
    for (let k = 2; ; k++) if (!taken(`${clean}-${k}`)) return `${clean}-${k}`;
  }

  addImport(result: ImportResult, sourceFiles: string[], mapping: ColumnMapping): RecordingSummary {
    const first = sourceFiles[0] ?? 'recording';
    const name = this.uniqueName((n) => this.store.recordings.has(n), basename(first, extname(first)));
    const ch = result.channels;
    const channels = [ch.time, ch.position, ...(ch.input ? [ch.input] : [])];
    const units = ['s', result.recording.coordinate === 'angle' ? 'rad' : 'm', ...(ch.input ? [''] : [])];
    const notices = [
      ...result.warnings.map((w) => ({ ...w, kind: 'warning' })),
      ...result.fixes.map((f) => ({ ...f, kind: 'fix' })),
    ];
    this.store.recordings.put({
      name,
      sourceFile: sourceFiles.map((f) => basename(f)).join(', '),
      channels,
      units,
      importSettings: { mapping: { ...mapping } as Record<string, string | number | boolean> },
      warnings: notices.map((n) => ({ ...n })),
      recording: result.recording,
    });
    this.dirty = true;
    return cachedSummary(this.store.recordings.peek(name)!);
  }
}
