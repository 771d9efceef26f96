// Project file throughput: save (atomic protocol) and open (all checks: header, layout,
// quick_check, integrity_check, sizes, SHA-256 of every blob, JSON shapes) of a project with
// RECORDINGS x RUNS runs of SAMPLES samples (t, q, u). Prints JSON lines.
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openProject, ProjectStore } from '../src-main/store/index.ts';

const RECORDINGS = 4;
const RUNS = 4;
const SAMPLES = 250_000;

const emit = (name: string, value: number, unit: string) => console.log(JSON.stringify({ name, value: Number(value.toPrecision(4)), unit }));

const p = ProjectStore.create();
for (let r = 0; r < RECORDINGS; r++) {
  const runs = [];
  for (let k = 0; k < RUNS; k++) {
    const t = new Float64Array(SAMPLES);
    const q = new Float64Array(SAMPLES);
    const u = new Float64Array(SAMPLES);
    for (let i = 0; i < SAMPLES; i++) {
      t[i] = i * 1e-3;
      q[i] = Math.sin(6.1 * t[i] + k) * Math.exp(-0.01 * t[i]);
      u[i] = Math.cos(3 * t[i]);
    }
    runs.push({ name: `run ${k + 1}`, source: `rec${r}.csv`, t, q, u });
  }
  p.recordings.put({ name: `rec-${r}`, sourceFile: `rec${r}.csv`, channels: ['t', 'q', 'u'], units: ['s', 'rad', 'N m'],
    importSettings: {}, warnings: [], recording: { coordinate: 'angle', runs } });
}
const sampleBytes = RECORDINGS * RUNS * SAMPLES * 3 * 8;
const dir = mkdtempSync(join(tmpdir(), 'ergostat-bench-'));
try {
  const path = join(dir, 'bench.ergostat');
  const saves: number[] = [];
  const opens: number[] = [];
  for (let rep = 0; rep < 3; rep++) {
    let t0 = performance.now();
    p.save(path);
    saves.push(performance.now() - t0);
    t0 = performance.now();
    openProject(path);
    opens.push(performance.now() - t0);
  }
  const best = (xs: number[]) => Math.min(...xs);
  emit('store.sample_bytes', sampleBytes / 2 ** 20, 'MiB');
  emit('store.file_overhead', statSync(path).size / sampleBytes - 1, 'fraction');
  emit('store.save_ms', best(saves), 'ms');
  emit('store.save_throughput', sampleBytes / 2 ** 20 / (best(saves) / 1000), 'MiB/s');
  emit('store.open_ms', best(opens), 'ms');
  emit('store.open_throughput', sampleBytes / 2 ** 20 / (best(opens) / 1000), 'MiB/s');
} finally {
  rmSync(dir, { recursive: true, force: true });
}
