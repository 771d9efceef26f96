// ODE integrator throughput on the pendulum theta'' = -(g/l) sin(theta) (l = 0.42 m, g = 9.81, 2 states):
// RK4 (fixed step), DOPRI5 (adaptive, at two tolerances), Störmer–Verlet. Prints JSON lines.
import { rk4Fixed, solveDopri5, solveVerlet } from '../src-main/engine/ode/index.ts';
import type { Rhs } from '../src-main/engine/types.ts';

const gl = 9.81 / 0.42;
const rhs: Rhs = (_t, y, d) => { d[0] = y[1]; d[1] = -gl * Math.sin(y[0]); };
const y0 = [2, 0];

/** Best of `reps` timed runs (ms) after one warm-up, to damp the noise of a shared machine. */
function best(reps: number, run: () => void): number {
  run();
  let b = Infinity;
  for (let i = 0; i < reps; i++) {
    const t0 = performance.now();
    run();
    b = Math.min(b, performance.now() - t0);
  }
  return b;
}
const emit = (name: string, value: number, unit: string, extra: Record<string, unknown> = {}): void => {
  console.log(JSON.stringify({ name, value: Math.round(value), unit, ...extra }));
};

{
  const steps = 500_000;
  const ms = best(3, () => { rk4Fixed(rhs, 0, y0, 1e-3, steps); });
  emit('ode.rk4.pendulum.steps_per_s', (steps / ms) * 1e3, 'steps/s', { steps, h: 1e-3 });
}
for (const [rtol, span] of [[1e-6, 20_000], [1e-12, 500]]) {
  let nSteps = 0, nfev = 0;
  const ms = best(3, () => {
    const r = solveDopri5(rhs, [0, span], y0, { rtol, atol: rtol, saveSteps: false });
    nSteps = r.nSteps; nfev = r.nfev;
  });
  emit(`ode.dopri5.pendulum.rtol_${rtol.toExponential()}.steps_per_s`, (nSteps / ms) * 1e3, 'steps/s', { steps: nSteps, nfev });
}
{
  let nSteps = 0;
  const ms = best(3, () => {
    const r = solveDopri5(rhs, [0, 1000], y0, { rtol: 1e-9, atol: 1e-9, dense: true, events: [{ g: (_t, y) => y[1] }] });
    nSteps = r.nSteps;
  });
  emit('ode.dopri5.pendulum.saved_dense_events.steps_per_s', (nSteps / ms) * 1e3, 'steps/s', { steps: nSteps, note: 'every step saved, interpolant kept, one event function' });
}
{
  const steps = 1_000_000;
  const ms = best(3, () => { solveVerlet((_t, q, a) => { a[0] = -gl * Math.sin(q[0]); }, [2], [0], { h: 1e-3, steps, stride: 1000 }); });
  emit('ode.verlet.pendulum.steps_per_s', (steps / ms) * 1e3, 'steps/s', { steps, h: 1e-3 });
}
