import { describe, it, expect } from 'vitest';
import { runMonteCarlo, runMonteCarloTrial, type MonteCarloProgress } from '../../src-main/trial-workers/index.ts';
import { pendulumTrial } from './fixtures.ts';

// Short trials at 200 Hz keep this file quick; the physics is the same as in the 1 kHz tests.
const trial = pendulumTrial(4, 200);

describe('runMonteCarlo on worker threads', () => {
  it('gives the same runs with 1 and 2 workers, equal to the same runs computed in this thread', async () => {
    const spec = { trial, runs: 6, mismatch: 0.15, seed: 31 };
    const progress: number[] = [];
    const one = await runMonteCarlo(spec, { workers: 1, onProgress: (p) => progress.push(p.completed) });
    const two = await runMonteCarlo(spec, { workers: 2 });
    expect(one.status).toBe('ok');
    expect(two.status).toBe('ok');
    expect(one.runs).toEqual(two.runs);
    expect(one.runs.map((r) => r.index)).toEqual([0, 1, 2, 3, 4, 5]);
    expect(progress).toEqual([1, 2, 3, 4, 5, 6]);
    expect(two.diagnostics.workersStarted).toBe(2);
    expect(two.diagnostics.workersExited).toBe(2);
    // Independent path: the same run computed here, without threads or structured cloning.
    const here = runMonteCarloTrial({ trial, mismatch: 0.15, seed: 31 }, 4);
    expect(one.runs[4].factors).toEqual(here.factors);
    expect(one.runs[4].outcome).toEqual(here.outcome);
    // Factors lie in [1 - p, 1 + p], and a different seed draws different ones.
    for (const r of one.runs) for (const f of Object.values(r.factors)) expect(Math.abs(f - 1)).toBeLessThanOrEqual(0.15);
    expect(runMonteCarloTrial({ trial, mismatch: 0.15, seed: 32 }, 0).factors).not.toEqual(one.runs[0].factors);
    expect(one.convergedShare).toBe(one.convergedCount / 6);
  });

  it('stops every worker when cancelled: status "cancelled", partial results, no progress after the abort', async () => {
    const long = pendulumTrial(20, 1000); // each run takes a while: 20 000 samples
    const ac = new AbortController();
    let afterAbort = 0;
    let aborted = false;
    const seen: MonteCarloProgress[] = [];
    const res = await runMonteCarlo({ trial: long, runs: 40, mismatch: 0.15, seed: 1 }, {
      workers: 2, signal: ac.signal,
      onProgress: (p) => {
        if (aborted) afterAbort++;
        seen.push(p);
        if (p.completed === 1) { aborted = true; ac.abort(); }
      },
    });
    expect(res.status).toBe('cancelled');
    expect(res.completed).toBeGreaterThanOrEqual(1);
    expect(res.completed).toBeLessThan(40);
    expect(res.runs.length).toBe(res.completed);
    expect(afterAbort).toBe(0);
    // The threads are gone: every started worker emitted 'exit' before the promise settled.
    expect(res.diagnostics.workersStarted).toBe(2);
    expect(res.diagnostics.workersExited).toBe(2);
    // Nothing arrives later either.
    await new Promise((r) => setTimeout(r, 300));
    expect(seen.length).toBe(res.completed);
  });

  it('does not start workers when the signal is already aborted', async () => {
    const ac = new AbortController();
    ac.abort();
    const res = await runMonteCarlo({ trial, runs: 3, mismatch: 0.1, seed: 0 }, { signal: ac.signal });
    expect(res.status).toBe('cancelled');
    expect(res.diagnostics.workersStarted).toBe(0);
    expect(Number.isNaN(res.convergedShare)).toBe(true);
  });

  it('refuses bad input at the door, naming it', () => {
    expect(() => runMonteCarlo({ trial, runs: 0, mismatch: 0.1, seed: 0 })).toThrow(/runs/);
    expect(() => runMonteCarlo({ trial, runs: 2, mismatch: 1.5, seed: 0 })).toThrow(/mismatch/);
    expect(() => runMonteCarlo({ trial, runs: 2, mismatch: 0.1, seed: -3 })).toThrow(/seed/);
    expect(() => runMonteCarlo({ trial, runs: 2, mismatch: 0.1, seed: 0 }, { workers: 0 })).toThrow(/workers/);
    expect(() => runMonteCarlo({ trial: { ...trial, plant: { ...trial.plant, acceleration: 'sin(' } }, runs: 2, mismatch: 0.1, seed: 0 })).toThrow(/trial\.plant\.acceleration/);
  });
});
