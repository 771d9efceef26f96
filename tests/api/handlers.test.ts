// The operation handlers over a Workspace: import -> summary -> trace -> save -> open.
import { describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { callOperation } from '../../src-main/api/gate.ts';
import { operations } from '../../src-main/api/table.ts';
import { createHandlers } from '../../src-main/api/handlers.ts';
import { decimateMinMax } from '../../src-main/api/decimate.ts';

const ctx = () => ({ signal: new AbortController().signal, progress: () => {} });

function csv(n: number, dt: number): string {
  const lines = ['time,angle'];
  for (let i = 0; i < n; i++) lines.push(`${(i * dt).toFixed(4)},${Math.sin(2 * Math.PI * 0.8 * i * dt).toFixed(6)}`);
  return lines.join('\n') + '\n';
}

describe('operation handlers', () => {
  it('imports text, summarises it, traces it, and survives save and open', async () => {
    const h = createHandlers();
    const call = (name: string, args: unknown) => callOperation(operations, h, name, args, ctx()) as Promise<any>;
    const r = await call('recordings.importText', { name: 'swing-a.csv', text: csv(500, 0.01), mapping: { time: 'time', position: 'angle', angle: true } });
    expect(r.recording.name).toBe('swing-a');
    expect(r.recording.runs).toHaveLength(1);
    expect(r.recording.runs[0].samples).toBe(500);
    // 100 Hz sampling: 499 steps over 4.99 s.
    expect(r.recording.runs[0].sampleRate).toBeCloseTo(100, 6);
    expect(r.project.dirty).toBe(true);
    const tr = await call('recordings.trace', { recording: 'swing-a', run: 0, maxPoints: 100 });
    expect(tr.decimated).toBe(true);
    expect(tr.t.length).toBeLessThanOrEqual(100);
    const dir = mkdtempSync(join(tmpdir(), 'ergostat-ws-'));
    const file = join(dir, 'p.ergostat');
    const saved = await call('project.save', { path: file });
    expect(saved).toMatchObject({ path: file, dirty: false });
    await call('project.new', {});
    expect((await call('project.state', {})).recordings).toHaveLength(0);
    const opened = await call('project.open', { path: file });
    expect(opened.recordings[0].runs[0].samples).toBe(500);
    await expect(call('recordings.trace', { recording: 'nope', run: 0, maxPoints: 100 })).rejects.toThrow('no recording named "nope"');
  });
  it('reports a bad CSV with its line and column', async () => {
    const h = createHandlers();
    const bad = 'time,angle\n0,0\n0.01,abc\n';
    await expect(callOperation(operations, h, 'recordings.importText', { name: 'bad.csv', text: bad, mapping: { time: 'time', position: 'angle' } }, ctx())).rejects.toThrow(/line 3/);
  });
});

describe('decimateMinMax', () => {
  it('keeps the extremes of every bucket', () => {
    const n = 10_000;
    const t = new Float64Array(n).map((_, i) => i);
    const y = new Float64Array(n).map((_, i) => Math.sin(i / 50));
    y[4321] = 7; // a single spike must survive decimation
    const d = decimateMinMax(t, y, 400);
    expect(d.t.length).toBeLessThanOrEqual(400);
    expect(Math.max(...d.y)).toBe(7);
    expect(Math.min(...d.y)).toBe(Math.min(...y));
    for (let i = 1; i < d.t.length; i++) expect(d.t[i]).toBeGreaterThan(d.t[i - 1]);
  });
});
