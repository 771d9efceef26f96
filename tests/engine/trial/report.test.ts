import { describe, it, expect } from 'vitest';
import { metricsLine, monteCarloLine } from '../../../src-main/engine/trial/report.ts';
import type { TrialMetrics } from '../../../src-main/engine/trial/metrics.ts';

const base: TrialMetrics = {
  target: 1, band: 0.02, resolution: null, bandBasis: 'relative', timeToBand: 2, converged: true, cycles: 5,
  finalEnergy: 1.01, finalError: 0.01, finalRelError: 0.01, spread: 0.1, spreadStd: 0.03, amplitude: 1, qMin: -1, qMax: 1,
  J: 3, peakU: 0.5, workAbs: 1, workNet: 0.5, totalVariation: 4, saturatedShare: null,
};

describe('trial text forms', () => {
  it('prints one JSON line of metrics, NaN as null', () => {
    const line = metricsLine('ok', 'completed', { ...base, finalRelError: NaN });
    expect(line.includes('\n')).toBe(false);
    const o = JSON.parse(line);
    expect(o.kind).toBe('trial');
    expect(o.converged).toBe(true);
    expect(o.metrics.finalRelError).toBeNull();
    expect(o.metrics.J).toBe(3);
  });

  it('summarises a Monte Carlo batch with the converged share and nearest-rank quantiles', () => {
    const ms = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10].map((k) => ({ ...base, timeToBand: k, finalRelError: -k / 100, J: k }));
    const o = JSON.parse(monteCarloLine({ status: 'ok', message: '', runs: 10, mismatch: 0.15, seed: 1, metrics: ms, converged: ms.map((_, i) => i !== 3) }));
    expect(o.convergedShare).toBe(0.9);
    expect(o.timeToBand.median).toBe(5); // nearest rank: ceil(0.5 * 10) = 5th value
    expect(o.timeToBand.p95).toBe(10); // ceil(9.5) = 10th
    expect(o.finalAbsRelError.max).toBe(0.1);
  });
});
