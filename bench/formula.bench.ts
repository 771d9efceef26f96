// Evaluations per second of the compiled pendulum acceleration (closure tree, parameters folded)
// against the same formula written by hand in TypeScript, measured in the same process.
// Prints JSON lines {"name", "value", "unit"}; the ratio is hand-written / compiled speed.
import { builtinPlant } from '../src-main/engine/plant/index.ts';
import { compileFormula } from '../src-main/engine/formula/index.ts';

const p = builtinPlant('pendulum');
const { m, l, g, c } = p.params;
const f = compileFormula(p.spec.acceleration, ['q', 'v', 'u', 't'], { constants: p.params });

const N = 2_000_000;
// Inputs vary so neither version can be hoisted out of the loop.
const qs = new Float64Array(1024), vs = new Float64Array(1024), us = new Float64Array(1024);
for (let i = 0; i < 1024; i++) { qs[i] = Math.sin(i) * 3; vs[i] = Math.cos(1.3 * i) * 5; us[i] = Math.sin(0.7 * i); }

function hand(q: number, v: number, u: number): number {
  return -(g / l) * Math.sin(q) - c * v + u / (m * l * l);
}

function runCompiled(): number {
  const x = new Float64Array(4);
  let s = 0;
  for (let i = 0; i < N; i++) {
    const j = i & 1023;
    x[0] = qs[j]; x[1] = vs[j]; x[2] = us[j]; x[3] = 0;
    s += f.eval(x);
  }
  return s;
}

function runHand(): number {
  let s = 0;
  for (let i = 0; i < N; i++) {
    const j = i & 1023;
    s += hand(qs[j], vs[j], us[j]);
  }
  return s;
}

/** Best time of each version over interleaved rounds (so load changes on a shared machine hit both alike). */
function race(runs: Array<() => number>, rounds = 9): { perSecond: number; sum: number }[] {
  const best = runs.map(() => Infinity), sums = runs.map(() => 0);
  for (let r = 0; r < rounds; r++) {
    runs.forEach((run, i) => {
      const t0 = performance.now();
      sums[i] = run();
      const ms = performance.now() - t0;
      if (r > 0) best[i] = Math.min(best[i], ms); // round 0 is the warm-up
    });
  }
  return best.map((ms, i) => ({ perSecond: N / (ms / 1000), sum: sums[i] }));
}

const [compiled, written] = race([runCompiled, runHand]);
if (Math.abs(compiled.sum - written.sum) > 1e-9 * Math.abs(written.sum)) {
  throw new Error(`formula bench: compiled and hand-written sums differ (${compiled.sum} vs ${written.sum})`);
}
const line = (name: string, value: number, unit: string): void => console.log(JSON.stringify({ name, value: Number(value.toPrecision(4)), unit }));
line('formula.pendulum.compiled', compiled.perSecond, 'eval/s');
line('formula.pendulum.handwritten', written.perSecond, 'eval/s');
line('formula.pendulum.slowdown', written.perSecond / compiled.perSecond, 'x (hand-written / compiled)');
