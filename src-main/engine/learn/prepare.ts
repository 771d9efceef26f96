// Checks a recording for learning and splits it into free-swing and forced runs: uniform common
// step, finite samples, angles unwrapped (idempotent on data that is already unwrapped).
import type { Recording } from '../types.ts';

export interface PreparedRun { name: string; q: Float64Array; u: Float64Array | null; forced: boolean }
export interface Prepared { dt: number; free: PreparedRun[]; forced: PreparedRun[]; samples: number }

/** Unwrapped copy: steps larger than pi are taken as wraps of 2 pi (Itoh 1982 condition). */
export function unwrapAngles(q: Float64Array): Float64Array {
  const out = new Float64Array(q.length);
  let shift = 0;
  for (let i = 0; i < q.length; i++) {
    if (i > 0) {
      const d = q[i] + shift - out[i - 1];
      if (d > Math.PI) shift -= 2 * Math.PI * Math.round(d / (2 * Math.PI));
      else if (d < -Math.PI) shift += 2 * Math.PI * Math.round(-d / (2 * Math.PI));
    }
    out[i] = q[i] + shift;
  }
  return out;
}

/** Throws a RangeError naming the run and field when the data cannot be used at all. */
export function prepareRecording(rec: Recording): Prepared {
  if (!rec || !Array.isArray(rec.runs)) throw new RangeError('recording: expected an object with a runs array');
  if (rec.coordinate !== 'angle' && rec.coordinate !== 'linear') throw new RangeError(`recording.coordinate: expected 'angle' or 'linear', got ${String(rec.coordinate)}`);
  if (rec.runs.length === 0) throw new RangeError('recording.runs: no runs');
  let dt = NaN;
  const free: PreparedRun[] = [], forced: PreparedRun[] = [];
  let samples = 0;
  rec.runs.forEach((run, r) => {
    const where = `recording.runs[${r}] (${run.name})`;
    const n = run.t?.length ?? 0;
    if (n < 2) throw new RangeError(`${where}.t: need at least 2 samples, got ${n}`);
    if (run.q.length !== n) throw new RangeError(`${where}.q: length ${run.q.length} differs from t (${n})`);
    if (run.u && run.u.length !== n) throw new RangeError(`${where}.u: length ${run.u.length} differs from t (${n})`);
    const h = (run.t[n - 1] - run.t[0]) / (n - 1);
    if (!(h > 0)) throw new RangeError(`${where}.t: time must increase`);
    for (let i = 1; i < n; i++) {
      const d = run.t[i] - run.t[i - 1];
      if (!(Math.abs(d - h) <= 0.01 * h)) throw new RangeError(`${where}.t: sampling is not uniform at sample ${i} (step ${d}, mean ${h})`);
    }
    if (Number.isNaN(dt)) dt = h;
    else if (Math.abs(h - dt) > 1e-6 * dt) throw new RangeError(`${where}.t: step ${h} s differs from the first run's ${dt} s; resample the runs to one rate`);
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(run.q[i])) throw new RangeError(`${where}.q[${i}]: not a finite number`);
      if (run.u && !Number.isFinite(run.u[i])) throw new RangeError(`${where}.u[${i}]: not a finite number`);
    }
    // The caller's arrays are only read, never written, so displacements are not copied (memory on big recordings).
    const q = rec.coordinate === 'angle' ? unwrapAngles(run.q) : run.q;
    let isForced = false;
    if (run.u) for (let i = 0; i < n; i++) if (run.u[i] !== 0) { isForced = true; break; }
    const pr: PreparedRun = { name: run.name, q, u: run.u ?? null, forced: isForced };
    (isForced ? forced : free).push(pr);
    samples += n;
  });
  return { dt, free, forced, samples };
}
