// Issue 4, "Tests that must exist": at least 95% of 200 Monte Carlo runs with +-15% parameter
// mismatch converge (cycle-averaged energy in the +-2% band, or the sensor's stated resolution if
// coarser). To keep the file to a few seconds the runs are 12 s long at a 200 Hz controller
// (instead of 1 kHz); the pump-up enters the band after about 3-5 s.
import { describe, it, expect } from 'vitest';
import { runMonteCarlo } from '../../src-main/trial-workers/index.ts';
import { pendulumTrial } from './fixtures.ts';

describe('Monte Carlo over +-15% mismatch of l, m and c', () => {
  it('converges in at least 95% of 200 runs (2 workers)', async () => {
    const res = await runMonteCarlo({ trial: pendulumTrial(12, 200), runs: 200, mismatch: 0.15, seed: 2026 }, { workers: 2 });
    expect(res.status).toBe('ok');
    expect(res.completed).toBe(200);
    expect(res.convergedShare).toBeGreaterThanOrEqual(0.95);
    // The band is judged on the cycle average; under mismatch the instantaneous spread is reported beside it.
    const spreads = res.runs.map((r) => r.outcome.metrics!.spread / r.outcome.metrics!.target);
    expect(Math.max(...spreads)).toBeGreaterThan(0.02);
  }, 120_000);
});
