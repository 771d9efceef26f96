// Long-run energy behaviour of DOPRI5 (kept apart from dopri5.test.ts: about 1.4 million steps in all).
import { describe, it, expect } from 'vitest';
import { solveDopri5 } from '../../../src-main/engine/ode/index.ts';
import { pendulumPeriod } from '../../../src-main/engine/special/index.ts';
import { G, L, duffing, energy, firstOrder, pendulum, orbitPeriod, rel, type Conservative } from './systems.ts';

describe('solveDopri5: long runs', () => {
  it('(test helper) orbitPeriod agrees with the elliptic pendulum period', () => {
    // Two independent computations: quadrature of the period integral vs 4 sqrt(l/g) K(m) (references.md §1).
    for (const deg of [30, 120, 170]) expect(rel(orbitPeriod(pendulum, (deg * Math.PI) / 180), pendulumPeriod((deg * Math.PI) / 180, G, L))).toBeLessThan(1e-10);
  });

  // 1000 periods at rtol = 1e-12: the energy error of a non-symplectic method drifts (grows
  // roughly linearly), but must stay below 1e-8 relative to the energy above the well bottom.
  // Last column: the least q the orbit must reach (pendulum: -q0; in-well Duffing orbit, V(1.3) < 0.25 =
  // barrier: stays right of the saddle q = 0; the orbit over the barrier reaches below the left well q = -1).
  const cases: [Conservative, number, string, (qMin: number) => boolean][] = [
    [pendulum, (120 * Math.PI) / 180, 'pendulum at 120 degrees', (qMin) => Math.abs(qMin + (120 * Math.PI) / 180) < 1e-6],
    [duffing, 1.3, 'Duffing orbit inside the right well', (qMin) => qMin > 0],
    [duffing, 1.6, 'Duffing orbit around both wells', (qMin) => qMin < -1],
  ];
  for (const [sys, q0, label, qMinOk] of cases) {
    it(`keeps the energy of the ${label} within 1e-8 relative over 1000 periods`, () => {
      const period = orbitPeriod(sys, q0);
      const H0 = energy(sys, q0, 0);
      let worst = 0, qMin = Infinity;
      const r = solveDopri5(firstOrder(sys), [0, 1000 * period], [q0, 0], {
        rtol: 1e-12, atol: 1e-12, saveSteps: false,
        onStep: (_t, y) => {
          worst = Math.max(worst, Math.abs(energy(sys, y[0], y[1]) - H0));
          qMin = Math.min(qMin, y[0]);
        },
      });
      expect(r.status).toBe('done');
      expect(qMinOk(qMin)).toBe(true);
      expect(worst / H0).toBeLessThan(1e-8);
    });
  }
});
