// What the Energy map screen draws, computed from a stored model and its recording: the energy
// along each run (velocity by the model's own Savitzky–Golay window), the potential V(q) = H(q, 0)
// and H on a phase-plane grid. Decimated for drawing.
import { estimateStates } from '../engine/learn/velocity.ts';
import { modelEvaluator, type EnergyModel } from '../engine/learn/index.ts';
import type { Recording } from '../engine/types.ts';
import { decimateMinMax } from './decimate.ts';
import type { EnergyGrid, RunEnergy } from './results.ts';

export function runEnergies(model: EnergyModel, rec: Recording, maxPoints = 1500): RunEnergy[] {
  if (model.status !== 'ok') return [];
  const ev = modelEvaluator(model);
  const order = model.metrics.savgolOrder || 4;
  const out: RunEnergy[] = [];
  for (const run of rec.runs) {
    const n = run.t.length;
    if (n < 2 * model.metrics.halfWindow + 1) continue;
    const dt = (run.t[n - 1] - run.t[0]) / (n - 1);
    const s = estimateStates(run.q, dt, model.metrics.halfWindow, order);
    const H = new Float64Array(n);
    let lo = Infinity;
    let hi = -Infinity;
    let sum = 0;
    for (let i = 0; i < n; i++) {
      H[i] = ev.H(s.q[i], s.v[i]);
      lo = Math.min(lo, H[i]);
      hi = Math.max(hi, H[i]);
      sum += H[i];
    }
    const step = Math.max(1, Math.ceil(n / maxPoints));
    const pick = <T extends ArrayLike<number>>(a: T) => Array.from({ length: Math.ceil(n / step) }, (_, k) => a[k * step]);
    const dH = decimateMinMax(run.t, H, maxPoints);
    out.push({ run: run.name, t: pick(run.t), q: pick(s.q), v: pick(s.v), H: dH.y.length === dH.t.length && !dH.decimated ? dH.y : pick(H), relativeSpread: (hi - lo) / Math.abs(sum / n || 1) });
  }
  return out;
}

export function potentialCurve(model: EnergyModel, points = 400): { q: number[]; V: number[] } {
  if (model.status !== 'ok' || !model.landscape) return { q: [], V: [] };
  const ev = modelEvaluator(model);
  const { qMin, qMax } = model.landscape;
  const q: number[] = [];
  const V: number[] = [];
  for (let i = 0; i < points; i++) {
    const x = qMin + ((qMax - qMin) * i) / (points - 1);
    q.push(x);
    V.push(ev.H(x, 0));
  }
  return { q, V };
}

export function energyGrid(model: EnergyModel, qMin: number, qMax: number, vMin: number, vMax: number, nq: number, nv: number): EnergyGrid {
  const ev = modelEvaluator(model);
  const q = Array.from({ length: nq }, (_, i) => qMin + ((qMax - qMin) * i) / (nq - 1));
  const v = Array.from({ length: nv }, (_, j) => vMin + ((vMax - vMin) * j) / (nv - 1));
  const H: number[] = new Array(nq * nv);
  for (let j = 0; j < nv; j++) for (let i = 0; i < nq; i++) H[j * nq + i] = ev.H(q[i], v[j]);
  return { q, v, H };
}
