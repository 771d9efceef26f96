// NAME_check.c: the engine's test vectors (vectors.ts) as a C table and a main() that replays
// them through the port from NAME_reset, sample by sample, comparing u, H and the stage.
// Acceptance: relative error <= 1e-9 for u and H, measured against max(|expected|, floor) where
// the floor is 1e-3 of the largest |value| of that column in the table; so values near zero
// are held to an absolute error of 1e-12 times the column's largest value (a few hundred ulps:
// what rounding differences in libm and in H - H* near the target can give). Stages must agree
// exactly. Exit status 0 only when every row passes; the worst errors are printed either way.
import { cDouble } from './literal.ts';
import type { VectorTable } from './vectors.ts';

export const CHECK_TOLERANCE = 1e-9;
export const CHECK_FLOOR_FRACTION = 1e-3;

function maxAbs(a: Float64Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) { const x = Math.abs(a[i]); if (x > m) m = x; }
  return m;
}

export function checkSource(name: string, tab: VectorTable): string {
  const p = name;
  const n = tab.t.length;
  if (n === 0) throw new RangeError('test vectors: the table is empty (the simulation diverged at once?)');
  const uFloor = Math.max(CHECK_FLOOR_FRACTION * maxAbs(tab.u), 1e-300);
  const hFloor = Math.max(CHECK_FLOOR_FRACTION * maxAbs(tab.H), 1e-300);
  const c = tab.coverage;
  const L: string[] = [];
  L.push(`/* ${name}_check.c: replays test vectors computed by the Ergostat engine through ${name}.c.`);
  L.push(` * ${n} consecutive controller samples from reset (states from: ${tab.source}); the table exercises`);
  L.push(` * ${c.saturated} saturated samples, ${c.rateLimited} rate-limited samples, ${c.zeroB} samples with b = 0 and ${c.switches} stage switch(es).`);
  L.push(` * Passes (exit 0) when every u and H agrees within relative error ${CHECK_TOLERANCE} (against max(|expected|, floor),`);
  L.push(` * floor = ${CHECK_FLOOR_FRACTION} x the largest |value| of the column) and every stage agrees exactly.`);
  L.push(` * Build: cc -std=c99 -O2 -Wall -Wextra -Werror ${name}.c ${name}_check.c -lm */`);
  L.push('#include <math.h>');
  L.push('#include <stdio.h>');
  L.push(`#include "${name}.h"`);
  L.push('');
  L.push('typedef struct { double t, q, v, u, H; int stage; } check_row;');
  L.push('');
  L.push('/* t, q, v (given to the controller), u, H (engine results), stage (after the sample). */');
  L.push('static const check_row rows[] = {');
  for (let i = 0; i < n; i++) {
    L.push(`  { ${cDouble(tab.t[i])}, ${cDouble(tab.q[i])}, ${cDouble(tab.v[i])}, ${cDouble(tab.u[i])}, ${cDouble(tab.H[i])}, ${tab.stage[i]} }${i === n - 1 ? '' : ','}`);
  }
  L.push('};');
  L.push(`static const double U_FLOOR = ${cDouble(uFloor)};`);
  L.push(`static const double H_FLOOR = ${cDouble(hFloor)};`);
  L.push(`static const double TOLERANCE = ${cDouble(CHECK_TOLERANCE)};`);
  L.push('');
  L.push('static double rel_err(double got, double want, double floor_) {');
  L.push('  const double d = fabs(got - want);');
  L.push('  const double scale = fabs(want) > floor_ ? fabs(want) : floor_;');
  L.push('  if (got != got || want != want) return (got != got && want != want) ? 0.0 : INFINITY;');
  L.push('  return d == 0.0 ? 0.0 : d / scale;');
  L.push('}');
  L.push('');
  L.push('int main(void) {');
  L.push(`  ${p}_state s;`);
  L.push('  const int n = (int)(sizeof rows / sizeof rows[0]);');
  L.push('  double worst_u = 0.0, worst_h = 0.0;');
  L.push('  int row_u = -1, row_h = -1, bad = 0, bad_stage = 0, first_stage = -1, i;');
  L.push(`  ${p}_reset(&s);`);
  L.push(`  if (s.stage != ${p}_INITIAL_STAGE) { printf("FAIL: reset left stage %d, expected %d\\n", s.stage, ${p}_INITIAL_STAGE); return 1; }`);
  L.push('  for (i = 0; i < n; i++) {');
  L.push(`    const double u = ${p}_step(&s, rows[i].q, rows[i].v, rows[i].t);`);
  L.push(`    const double h = ${p}_energy(rows[i].q, rows[i].v);`);
  L.push('    const double eu = rel_err(u, rows[i].u, U_FLOOR), eh = rel_err(h, rows[i].H, H_FLOOR);');
  L.push('    if (!(eu <= worst_u)) { worst_u = eu; row_u = i; }');
  L.push('    if (!(eh <= worst_h)) { worst_h = eh; row_h = i; }');
  L.push('    if (!(eu <= TOLERANCE) || !(eh <= TOLERANCE)) bad++;');
  L.push('    if (s.stage != rows[i].stage) { if (first_stage < 0) first_stage = i; bad_stage++; }');
  L.push('  }');
  L.push('  printf("%d rows; worst relative error: u %.3e (row %d), H %.3e (row %d); stage mismatches %d (first row %d)\\n",');
  L.push('         n, worst_u, row_u, worst_h, row_h, bad_stage, first_stage);');
  L.push('  if (bad > 0 || bad_stage > 0) {');
  L.push('    printf("FAIL: %d row(s) outside the tolerance %.1e, %d stage mismatch(es)\\n", bad, TOLERANCE, bad_stage);');
  L.push('    return 1;');
  L.push('  }');
  L.push('  printf("PASS\\n");');
  L.push('  return 0;');
  L.push('}');
  return L.join('\n') + '\n';
}
