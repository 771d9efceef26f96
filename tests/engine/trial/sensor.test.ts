import { describe, it, expect } from 'vitest';
import { makeSensor, sensorStep, wrapAngle } from '../../../src-main/engine/trial/sensor.ts';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';

describe('sensorStep', () => {
  it('gives 2 pi / 2^bits for an angle encoder and range / 2^bits for a linear ADC', () => {
    // Definition of an n-bit encoder over one turn (common practice).
    expect(sensorStep({ bits: 12 }, 'angle')).toBe((2 * Math.PI) / 4096);
    expect(sensorStep({ bits: 10, range: 0.5 }, 'linear')).toBe(0.5 / 1024);
    expect(sensorStep({ step: 1e-3 }, 'linear')).toBe(1e-3);
    expect(sensorStep({}, 'linear')).toBe(0);
  });

  it('refuses bad settings, naming the field', () => {
    expect(() => sensorStep({ bits: 12 }, 'linear')).toThrow(/sensor\.range is required/);
    expect(() => sensorStep({ bits: 0 }, 'angle')).toThrow(/sensor\.bits/);
    expect(() => sensorStep({ bits: 12.5 }, 'angle')).toThrow(/sensor\.bits/);
    expect(() => sensorStep({ step: -1 }, 'linear')).toThrow(/sensor\.step/);
    expect(() => sensorStep({ step: 1, bits: 3 }, 'angle')).toThrow(/either step or bits/);
    expect(() => makeSensor({ noiseStd: 0.1 }, 'linear')).toThrow(/random source/);
    expect(() => makeSensor({ noiseStd: -0.1 }, 'linear')).toThrow(/sensor\.noiseStd/);
  });
});

describe('makeSensor', () => {
  it('quantizes to the nearest multiple of the step (error at most half a step)', () => {
    // Mid-tread uniform quantizer, Widrow & Kollar (2008) ch. 4: x_q = step round(x / step).
    const s = makeSensor({ step: 0.01 }, 'linear');
    expect(s.measure(0.123)).toBeCloseTo(0.12, 14);
    expect(s.measure(0.127)).toBeCloseTo(0.13, 14);
    expect(s.measure(-0.004)).toBeCloseTo(0, 14);
    for (let x = -1; x < 1; x += 0.00137) {
      const y = s.measure(x);
      expect(Math.abs(y - x)).toBeLessThanOrEqual(0.005 + 1e-15);
      expect(Math.abs(y / 0.01 - Math.round(y / 0.01))).toBeLessThan(1e-9);
    }
  });

  it('wraps angles to [-pi, pi) like an absolute encoder', () => {
    const s = makeSensor({ bits: 12 }, 'angle');
    const step = (2 * Math.PI) / 4096;
    for (const q of [0.3, Math.PI + 0.2, -Math.PI - 0.2, 7 * Math.PI + 0.01, Math.PI - 1e-6]) {
      const y = s.measure(q);
      expect(y).toBeGreaterThanOrEqual(-Math.PI);
      expect(y).toBeLessThan(Math.PI);
      // Same angle modulo 2 pi, within half a step.
      expect(Math.abs(wrapAngle(y - q))).toBeLessThanOrEqual(step / 2 + 1e-12);
    }
    expect(wrapAngle(Math.PI)).toBeCloseTo(-Math.PI, 15);
    expect(wrapAngle(-Math.PI)).toBeCloseTo(-Math.PI, 15);
  });

  it('adds Gaussian noise of the requested standard deviation (sample statistics)', () => {
    const rng = new Pcg32(5, 3);
    const s = makeSensor({ noiseStd: 0.02 }, 'linear', () => rng.uniform());
    const n = 40000;
    let sum = 0, sum2 = 0;
    for (let i = 0; i < n; i++) { const e = s.measure(1) - 1; sum += e; sum2 += e * e; }
    const mean = sum / n, sd = Math.sqrt(sum2 / n - mean * mean);
    // Standard error of the mean 0.02 / sqrt(n) = 1e-4: allow 5 of them; of the sd about 0.35%: allow 2%.
    expect(Math.abs(mean)).toBeLessThan(5e-4);
    expect(Math.abs(sd / 0.02 - 1)).toBeLessThan(0.02);
  });
});
