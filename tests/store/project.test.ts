import { createHash } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { openProject, ProjectFileError, ProjectStore, type ProjectStore as Store } from '../../src-main/store/index.ts';
import { AWKWARD, noise, sameBytes, sampleProject, scratchDir, timeBase } from './helpers.ts';

const { dir, cleanup } = scratchDir('project');
afterAll(cleanup);

/** Every sample array, byte for byte, and every other field by deep equality (independent of the store's code). */
function expectSameProject(a: Store, b: Store): void {
  expect(b.recordings.names()).toEqual(a.recordings.names());
  for (const name of a.recordings.names()) {
    const x = a.recordings.get(name)!;
    const y = b.recordings.get(name)!;
    const { recording: rx, ...restX } = x;
    const { recording: ry, ...restY } = y;
    expect(restY).toEqual(restX);
    expect(ry.coordinate).toBe(rx.coordinate);
    expect(ry.runs.length).toBe(rx.runs.length);
    rx.runs.forEach((run, i) => {
      const other = ry.runs[i];
      expect(other.name).toBe(run.name);
      expect(other.source).toBe(run.source);
      expect(sameBytes(other.t, run.t)).toBe(true);
      expect(sameBytes(other.q, run.q)).toBe(true);
      expect(other.u === undefined).toBe(run.u === undefined);
      if (run.u) expect(sameBytes(other.u!, run.u)).toBe(true);
    });
  }
  expect(b.models.list()).toEqual(a.models.list());
  expect(b.designs.list()).toEqual(a.designs.list());
  expect(b.notes.list()).toEqual(a.notes.list());
  expect(b.trials.names()).toEqual(a.trials.names());
  a.trials.list().forEach((t, i) => {
    const u = b.trials.list()[i];
    expect({ ...u, traces: [] }).toEqual({ ...t, traces: [] });
    expect(u.traces.map((x) => [x.name, x.unit])).toEqual(t.traces.map((x) => [x.name, x.unit]));
    t.traces.forEach((tr, k) => expect(sameBytes(u.traces[k].data, tr.data)).toBe(true));
  });
}

describe('ProjectStore round trip', () => {
  it('keeps every sample bit for bit, including NaN payloads, -0, subnormals and extremes', () => {
    const p = sampleProject(64);
    const path = join(dir, 'round.ergostat');
    p.save(path);
    const back = openProject(path);
    expectSameProject(p, back);
    // The awkward values by their own bits (IEEE 754 patterns listed in helpers.ts), not only "same as before".
    const q = back.recordings.get('swing-a')!.recording.runs[0].q;
    expect(sameBytes(q.subarray(0, AWKWARD.length), AWKWARD)).toBe(true);
    expect(Object.is(q[3], -0)).toBe(true); // -0 survives (IEEE 754 sign bit)
    expect(q[4]).toBe(Number.MIN_VALUE); // 2^-1074, smallest subnormal
    expect(back.recordings.get('beam-b')!.recording.runs[0].q[0]).toBe(1e300);
  });

  it('open -> save -> open is lossless, and a re-save with the same time writes the same bytes', () => {
    const now = new Date('2026-12-01T12:00:00Z');
    const a = join(dir, 'a.ergostat');
    const b = join(dir, 'b.ergostat');
    sampleProject(300).save(a, { now });
    const first = openProject(a);
    first.save(b, { now });
    const second = openProject(b);
    expectSameProject(first, second);
    expect(readFileSync(b).equals(readFileSync(a))).toBe(true);
    expect(second.info).toEqual({ appVersion: first.info.appVersion, createdAt: '2026-12-01T10:00:00.000Z', modifiedAt: now.toISOString() });
  });

  it('leaves no -journal, -wal or temp file beside the saved file, which is in rollback-journal mode', () => {
    const sub = join(dir, 'alone');
    mkdirSync(sub);
    const path = join(sub, 'alone.ergostat');
    sampleProject(100).save(path);
    sampleProject(200).save(path); // and a second save over it
    expect(readdirSync(sub)).toEqual(['alone.ergostat']);
    const head = readFileSync(path).subarray(0, 100);
    // SQLite file format, database header offsets 18 and 19: 1 = legacy rollback journal, 2 = WAL.
    expect([head[18], head[19]]).toEqual([1, 1]);
    const db = new Database(path, { readonly: true });
    expect(db.pragma('journal_mode', { simple: true })).toBe('delete');
    db.close();
    expect(readdirSync(sub)).toEqual(['alone.ergostat']);
  });

  it('stores samples as little-endian Float64 with the SHA-256 of the blob', () => {
    const path = join(dir, 'raw.ergostat');
    const p = ProjectStore.create();
    p.recordings.put({
      name: 'r', sourceFile: 'r.csv', channels: ['t', 'q'], units: ['s', 'm'], importSettings: {}, warnings: [],
      recording: { coordinate: 'linear', runs: [{ name: 'one', source: 'r.csv', t: new Float64Array([0, 1]), q: new Float64Array([1, -2.5]) }] },
    });
    p.save(path);
    const db = new Database(path, { readonly: true });
    const row = db.prepare('SELECT q, q_sha256 FROM runs').get() as { q: Buffer; q_sha256: string };
    db.close();
    // IEEE 754: 1.0 = 0x3FF0000000000000, -2.5 = 0xC004000000000000, written low byte first.
    expect(row.q.toString('hex')).toBe('000000000000f03f00000000000004c0');
    expect(row.q_sha256).toBe(createHash('sha256').update(row.q).digest('hex'));
  });
});

describe('ProjectStore entries', () => {
  it('copies on the way in and out, so callers cannot change what it holds', () => {
    const p = ProjectStore.create();
    const t = timeBase(4);
    const q = noise(4);
    const settings = { delimiter: ';' };
    p.recordings.put({ name: 'x', sourceFile: '', channels: ['t', 'q'], units: ['s', 'rad'], importSettings: settings, warnings: [],
      recording: { coordinate: 'angle', runs: [{ name: 'r', source: '', t, q }] } });
    q[0] = 99;
    settings.delimiter = 'changed';
    const got = p.recordings.get('x')!;
    expect(got.recording.runs[0].q[0]).not.toBe(99);
    expect(got.importSettings).toEqual({ delimiter: ';' });
    got.recording.runs[0].q[1] = 42;
    expect(p.recordings.get('x')!.recording.runs[0].q[1]).not.toBe(42);
    // peek hands out the stored entry itself (no copy), for summaries of big recordings.
    expect(p.recordings.peek('x')).toBe(p.recordings.peekAll()[0]);
    expect(p.recordings.peek('x')!.recording.runs[0].q[1]).toBe(got.recording.runs[0].q[1] === 42 ? q[1] : NaN);
  });

  it('replaces an entry of the same name in place and keeps the order', () => {
    const p = ProjectStore.create();
    for (const n of ['a', 'b', 'c']) p.notes.put({ name: n, text: n });
    p.notes.put({ name: 'b', text: 'B' });
    expect(p.notes.list()).toEqual([{ name: 'a', text: 'a' }, { name: 'b', text: 'B' }, { name: 'c', text: 'c' }]);
    expect(p.notes.remove('a')).toBe(true);
    expect(p.notes.remove('a')).toBe(false);
    expect(p.notes.names()).toEqual(['b', 'c']);
  });

  it('refuses bad entries at the door, naming the field', () => {
    const p = ProjectStore.create();
    const base = { name: 'x', sourceFile: '', channels: ['t', 'q'], units: ['s', 'rad'], importSettings: {}, warnings: [] };
    const run = (t: number[], q: number[], u?: number[]) => ({
      ...base, recording: { coordinate: 'angle' as const, runs: [{ name: 'r', source: '', t: new Float64Array(t), q: new Float64Array(q), ...(u ? { u: new Float64Array(u) } : {}) }] },
    });
    expect(() => p.recordings.put(run([0, 1, 1], [0, 0, 0]))).toThrow(/recording\.recording\.runs\[0\]\.t\[2\]: time must be strictly increasing/);
    expect(() => p.recordings.put(run([0, NaN], [0, 0]))).toThrow(/t\[1\]: time must be finite/);
    expect(() => p.recordings.put(run([0, 1], [0, 0], [1]))).toThrow(/runs\[0\]\.u: 1 samples, but t has 2/);
    expect(() => p.recordings.put({ ...run([0], [0]), units: ['s'] })).toThrow(/units: 1 units for 2 channels/);
    expect(() => p.models.put({ name: 'm', kind: 'bad kind!', body: {} })).toThrow(/model\.kind: "bad kind!" is not a kind/);
    expect(() => p.models.put({ name: 'm', kind: 'k', body: [] as never })).toThrow(/model\.body: expected a JSON object, got an array/);
    expect(() => p.designs.put({ name: 'd', kind: 'k', body: { gain: NaN } })).toThrow(/design\.body\.gain: NaN cannot be stored as JSON/);
    expect(() => p.designs.put({ name: 'd', kind: 'k', body: JSON.parse('{"__proto__": {"x": 1}}') })).toThrow(/"__proto__" is not allowed/);
    expect(() => p.designs.put({ name: '', kind: 'k', body: {} })).toThrow(/design\.name: must not be empty/);
    expect(() => p.trials.put({ name: 't', kind: 'k', settings: {}, metrics: {}, traces: [
      { name: 'a', unit: '', data: new Float64Array(1) }, { name: 'a', unit: '', data: new Float64Array(1) }] })).toThrow(/traces\[1\]\.name: "a" is used twice/);
    expect(p.recordings.size + p.models.size + p.designs.size + p.trials.size).toBe(0);
  });

  it('enforces the count and size limits it was created with', () => {
    const p = ProjectStore.create({ limits: { maxDocuments: 2, maxBlobBytes: 80 } });
    p.notes.put({ name: 'a', text: '' });
    p.notes.put({ name: 'b', text: '' });
    p.notes.put({ name: 'b', text: 'replacing is not adding' });
    expect(() => p.notes.put({ name: 'c', text: '' })).toThrow('note: the project already holds 2, the limit');
    expect(() => p.trials.put({ name: 't', kind: 'k', settings: {}, metrics: {}, traces: [{ name: 'x', unit: '', data: new Float64Array(11) }] }))
      .toThrow('trial.traces[0].data: 88 bytes of samples, over the limit of 80');
  });

  it('refuses to save under a name without the .ergostat extension', () => {
    const p = ProjectStore.create();
    const path = join(dir, 'project.sqlite');
    expect(() => p.save(path)).toThrow(ProjectFileError);
    expect(() => p.save(path)).toThrow(/must end in \.ergostat/);
    expect(readdirSync(dir)).not.toContain('project.sqlite');
  });
});
