// Shared pieces of the store tests: a scratch folder per test file and a sample project whose
// samples include the awkward IEEE 754 values (NaN with and without payload, -0, subnormals,
// huge and tiny magnitudes, infinities).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ProjectStore } from '../../src-main/store/index.ts';

export function scratchDir(tag: string): { dir: string; cleanup: () => void } {
  const dir = mkdtempSync(join(tmpdir(), `ergostat-${tag}-`));
  return { dir, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}

/** Float64 values from raw bit patterns (hi, lo words), so the test states the bits it expects. */
export function fromBits(words: [number, number][]): Float64Array {
  const out = new Float64Array(words.length);
  const view = new DataView(out.buffer);
  words.forEach(([hi, lo], i) => {
    view.setUint32(i * 8, lo, true);
    view.setUint32(i * 8 + 4, hi, true);
  });
  return out;
}

/**
 * IEEE 754 binary64 bit patterns (IEEE 754-2008 section 3.4; common practice): quiet NaN
 * 0x7ff8000000000000, a NaN with payload 0x7ff8000000000123, a signalling-pattern NaN
 * 0x7ff0000000000001, -0, smallest subnormal 2^-1074, largest subnormal, largest finite
 * (~1.797e308), smallest normal 2^-1022, +-Infinity, 1 and -2.5.
 */
export const AWKWARD = fromBits([
  [0x7ff80000, 0x00000000],
  [0x7ff80000, 0x00000123],
  [0x7ff00000, 0x00000001],
  [0x80000000, 0x00000000],
  [0x00000000, 0x00000001],
  [0x000fffff, 0xffffffff],
  [0x7fefffff, 0xffffffff],
  [0x00100000, 0x00000000],
  [0x7ff00000, 0x00000000],
  [0xfff00000, 0x00000000],
  [0x3ff00000, 0x00000000],
  [0xc0040000, 0x00000000],
]);

export function sameBytes(a: Float64Array, b: Float64Array): boolean {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).equals(Buffer.from(b.buffer, b.byteOffset, b.byteLength));
}

/** A uniform time base 0, dt, 2 dt, ... */
export function timeBase(n: number, dt = 0.01): Float64Array {
  const t = new Float64Array(n);
  for (let i = 0; i < n; i++) t[i] = i * dt;
  return t;
}

/** A deterministic pseudo-random sequence (xorshift32), for bulk data. */
export function noise(n: number, seed = 1): Float64Array {
  const out = new Float64Array(n);
  let s = seed >>> 0 || 1;
  for (let i = 0; i < n; i++) {
    s ^= s << 13; s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5; s >>>= 0;
    out[i] = s / 4294967296 - 0.5;
  }
  return out;
}

/** A small project with one of everything; `samples` sets the run length. */
export function sampleProject(samples = 64, marker = 'generation 1'): ProjectStore {
  const p = ProjectStore.create({ now: new Date('2026-12-01T10:00:00Z') });
  const q = noise(samples, 7);
  q.set(AWKWARD.subarray(0, Math.min(AWKWARD.length, samples)));
  const u = noise(samples, 11);
  u.set(AWKWARD.slice(0, Math.min(AWKWARD.length, samples)).reverse());
  p.recordings.put({
    name: 'swing-a',
    sourceFile: 'swing-a.csv',
    channels: ['time', 'theta', 'torque'],
    units: ['s', 'rad', 'N m'],
    importSettings: { delimiter: ',', columns: { t: 0, q: 1, u: 2 }, unwrap: true },
    warnings: [{ kind: 'quantized', step: 0.0015 }, 'fixed 2 duplicate time stamps'],
    recording: {
      coordinate: 'angle',
      runs: [
        { name: 'swing-a.csv run 1', source: 'swing-a.csv', t: timeBase(samples), q, u },
        { name: 'swing-a.csv run 2', source: 'swing-a.csv', t: timeBase(samples, 0.02), q: noise(samples, 3) },
      ],
    },
  });
  p.recordings.put({
    name: 'beam-b',
    sourceFile: '',
    channels: ['t', 'x'],
    units: ['s', 'm'],
    importSettings: {},
    warnings: [],
    recording: { coordinate: 'linear', runs: [{ name: 'sim', source: '', t: timeBase(5), q: new Float64Array([1e300, -1e-300, 0, 3, 4]) }] },
  });
  p.models.put({ name: 'energy-1', kind: 'koopman-energy', body: { terms: ['v^2', 'cos(q)'], xi: [0.5, -9.81], lambda: -0.02 } });
  p.designs.put({ name: 'hold-1', kind: 'level-hold', body: { target: { energy: 1.5 }, Q: 1, R: 0.1, limits: { u: 2 } } });
  p.trials.put({
    name: 'trial-1',
    kind: 'closed-loop',
    settings: { design: 'hold-1', dt: 0.001, noise: { q: 1e-4 } },
    metrics: { J: 12.5, settle: 3.2, peakU: 2 },
    traces: [
      { name: 't', unit: 's', data: timeBase(samples, 0.001) },
      { name: 'H', unit: 'J', data: AWKWARD.slice() },
    ],
  });
  p.notes.put({ name: 'readme', text: `${marker}\nrig: 0.42 m pendulum; <b>not html</b> \u00e9\u4e2d\ud83d\ude00` });
  return p;
}
