// Generates NAME.h and NAME.c for a ControllerDesign (design/types.ts): the energy H(q, v) and
// its gradient from the design's formula and its symbolic derivatives (formula-c.ts), the
// level-hold law of engine/control/level-hold.ts (SDRE on the energy coordinate, design.md §2:
// feedback + loss compensation, then saturation, then the rate limit; the integral variant with
// one 2x2 CARE per sample, care2-c.ts) and the supervisor of design/supervisor.ts (explicit stage
// variable; each stage's transitions tried in document order, the first that holds fires, at
// most one per sample, the new stage's integrator starts at 0 and the rate limit carries over).
// The generated code allocates nothing, uses only <math.h>, and writes every constant with 17
// significant digits.
import type { ControllerDesign, SwitchCondition } from '../../design/types.ts';
import { differentiate, formatFormula, parseFormula } from '../../engine/formula/index.ts';
import { care2Source } from './care2-c.ts';
import { formulaToC, helperSource } from './formula-c.ts';
import { cDouble, cOperand, commentLines } from './literal.ts';

export interface SourceInfo {
  /** Header text of the safety cautions and the deference, one entry per caution. */
  cautions: readonly string[];
  deference: string;
  /** Ergostat version writing the files. */
  appVersion: string;
}

function conditionC(c: SwitchCondition, p: string, angle: boolean): string {
  const qq = angle && c.wrapped === true ? `${p}_wrap(q)` : 'q';
  const parts: string[] = [];
  if (c.qAbove !== undefined) parts.push(`${qq} > ${cOperand(c.qAbove)}`);
  if (c.qBelow !== undefined) parts.push(`${qq} < ${cOperand(c.qBelow)}`);
  if (c.vSign !== undefined) parts.push(c.vSign > 0 ? 'v > 0.0' : 'v < 0.0');
  if (c.energyAbove !== undefined) parts.push(`h > ${cOperand(c.energyAbove)}`);
  if (c.energyBelow !== undefined) parts.push(`h < ${cOperand(c.energyBelow)}`);
  return parts.length === 0 ? '1' : parts.map((s) => `(${s})`).join(' && ');
}

/** Plain-language description of a condition for comments. */
export function describeCondition(c: SwitchCondition): string {
  const q = c.wrapped ? 'wrapped q' : 'q';
  const parts: string[] = [];
  if (c.qAbove !== undefined) parts.push(`${q} > ${c.qAbove}`);
  if (c.qBelow !== undefined) parts.push(`${q} < ${c.qBelow}`);
  if (c.vSign !== undefined) parts.push(c.vSign > 0 ? 'v > 0' : 'v < 0');
  if (c.energyAbove !== undefined) parts.push(`H > ${c.energyAbove}`);
  if (c.energyBelow !== undefined) parts.push(`H < ${c.energyBelow}`);
  return parts.length === 0 ? 'always' : parts.join(' and ');
}

export function headerSource(design: ControllerDesign, name: string, info: SourceInfo): string {
  const p = name;
  const law = design.law;
  const unit = design.input.unit || 'input unit';
  const qUnit = design.model.coordinate === 'angle' ? 'rad' : 'm';
  const L: string[] = [];
  L.push('/*');
  L.push(` * ${name}.h: energy-level controller exported by Ergostat ${info.appVersion} (generated file; do not edit,`);
  L.push(' * export again from the design instead).');
  L.push(' *');
  L.push(' * SAFETY. Energy controllers deliberately put energy into hardware.');
  for (const c of info.cautions) L.push(...commentLines(`- ${c}`, ' *   ', 92));
  L.push(...commentLines(info.deference, ' * ', 96));
  L.push(' *');
  L.push(...commentLines(`Design: ${design.kind}, ${design.stages.length} stage(s); written by Ergostat ${design.app}. Source: ${design.source}`));
  L.push(...commentLines(`Energy H(q, v) = ${formatFormula(parseFormula(design.model.energy))} [${design.model.units}], q in ${qUnit}, v in ${qUnit}/s; Koopman eigenvalue ${design.model.lambda} 1/s.`));
  L.push(...commentLines(`Valid range of the recordings: q from ${design.model.validRange.qMin} to ${design.model.validRange.qMax} ${qUnit}, H from ${design.model.validRange.energyMin} to ${design.model.validRange.energyMax} ${design.model.units}. Outside it the energy is an extrapolation.`));
  L.push(...commentLines(`Law: SDRE on the energy coordinate z = H - H*, Q = ${law.Q}, R = ${law.R}, eps = ${law.eps}, lambda = ${law.lambda} 1/s, input gain g = ${design.input.gain}; `
    + `${law.integral ? `integral action (Qw = ${law.integral.Qw}, anti-windup ${law.integral.antiWindup}, one 2x2 CARE per sample)` : 'no integral action'}; `
    + `loss compensation ${law.lossCompensation ? 'on' : 'off'}.`));
  L.push(...commentLines(`Limits: |u| <= ${law.uMax ?? 'none'} ${law.uMax === null ? '' : unit}; |du/dt| <= ${law.rateMax ?? 'none'} ${law.rateMax === null ? '' : `${unit}/s`}. `
    + 'Saturation is applied after feedback and loss compensation, then the rate limit.'));
  L.push(...commentLines(`Sample rate ${design.sampleRateHz} Hz: call ${p}_step exactly once per sample period (${1 / design.sampleRateHz} s). `
    + `The design assumed a delay of ${design.delaySamples} sample(s) between measurement and actuation; this code adds none.`));
  for (const s of design.stages) {
    L.push(...commentLines(`Stage ${s.index} (${s.name}): target H* = ${s.target.energy} ${design.model.units}${s.meanB2 !== null && law.lossCompensation ? `, <b^2> = ${s.meanB2}` : ''}.`));
  }
  design.transitions.forEach((t, i) => {
    L.push(...commentLines(`Switch ${i + 1}: stage ${t.from} -> ${t.to} when ${describeCondition(t.when)}${t.reason ? ` (${t.reason})` : ''}.`));
  });
  L.push(' */');
  L.push(`#ifndef ${p}_H_INCLUDED`);
  L.push(`#define ${p}_H_INCLUDED`);
  L.push('');
  L.push(`#define ${p}_SAMPLE_RATE_HZ ${cDouble(design.sampleRateHz)}`);
  L.push(`#define ${p}_STAGES ${design.stages.length}`);
  L.push(`#define ${p}_INITIAL_STAGE ${design.initialStage}`);
  L.push('');
  L.push('/* Controller state: initialise with _reset; read, never write, between steps. */');
  L.push('typedef struct {');
  L.push('  int stage;             /* current supervisor stage, 1-based */');
  L.push('  double u_prev;         /* last output (rate-limit memory) */');
  L.push('  double w;              /* integral of z (integral action only) */');
  L.push('  double H;              /* energy at the last sample */');
  L.push('  double z;              /* H - H* at the last sample */');
  L.push('  double b;              /* b = g dH/dv at the last sample */');
  L.push('  int saturated;         /* 1 when saturation or the rate limit changed the command */');
  L.push('  int riccati_ok;        /* 0 when the per-sample CARE had no stabilizing solution (u_fb = 0) */');
  L.push('  int fault;             /* 1 when the stage variable was found corrupt (u = 0 returned) */');
  L.push('  unsigned long switches;  /* stage switches since reset */');
  L.push('  double t_switch;       /* time of the last switch */');
  L.push(`} ${p}_state;`);
  L.push('');
  L.push(`/* Back to the initial stage with u_prev = 0, w = 0. */`);
  L.push(`void ${p}_reset(${p}_state *s);`);
  L.push(`/* One controller sample at position q, velocity v, time t (s); returns u to hold until the next sample. */`);
  L.push(`double ${p}_step(${p}_state *s, double q, double v, double t);`);
  L.push('/* The energy H(q, v) and its gradient [dH/dq, dH/dv]. */');
  L.push(`double ${p}_energy(double q, double v);`);
  L.push(`void ${p}_energy_gradient(double q, double v, double grad[2]);`);
  L.push('');
  L.push(`#endif /* ${p}_H_INCLUDED */`);
  return L.join('\n') + '\n';
}

export function bodySource(design: ControllerDesign, name: string, info: SourceInfo): string {
  const p = name;
  const law = design.law;
  const ast = parseFormula(design.model.energy);
  let code;
  try {
    code = formulaToC([ast, differentiate(ast, 'q'), differentiate(ast, 'v')], p);
  } catch (e) {
    throw new RangeError(`design.model.energy: ${(e as Error).message}`);
  }
  code.helpers.add('sign');
  const n = design.stages.length;
  const angle = design.model.coordinate === 'angle';
  const L: string[] = [];
  L.push(`/* ${name}.c: generated by Ergostat ${info.appVersion} from a controller design; see ${name}.h for the`);
  L.push(' * safety cautions, the design and its limits. C99, <math.h> only, no allocation. */');
  L.push('#include <math.h>');
  L.push(`#include "${name}.h"`);
  L.push('');
  L.push('/* Constants of the design (17 significant digits). */');
  // The period is used by the rate limit and the integrator only (an unused static const is an error under -Werror).
  if (law.rateMax !== null || law.integral) L.push(`static const double ${p}_DT = ${cDouble(1 / design.sampleRateHz)}; /* sample period, s */`);
  L.push(`static const double ${p}_G = ${cDouble(design.input.gain)}; /* input gain g */`);
  L.push(`static const double ${p}_Q = ${cDouble(law.Q)};`);
  L.push(`static const double ${p}_R = ${cDouble(law.R)};`);
  L.push(`static const double ${p}_EPS = ${cDouble(law.eps)}; /* sign regularisation width, unit of b */`);
  L.push(`static const double ${p}_LAMBDA = ${cDouble(law.lambda)}; /* Koopman eigenvalue used by the law, 1/s */`);
  if (law.integral) L.push(`static const double ${p}_QW = ${cDouble(law.integral.Qw)}; /* weight on w^2 */`);
  if (law.uMax !== null) L.push(`static const double ${p}_UMAX = ${cDouble(law.uMax)}; /* |u| limit */`);
  if (law.rateMax !== null) L.push(`static const double ${p}_RATE_MAX = ${cDouble(law.rateMax)}; /* |du/dt| limit, per second */`);
  L.push(`static const double ${p}_TARGET[${n}] = { ${design.stages.map((s) => cDouble(s.target.energy)).join(', ')} }; /* H* per stage */`);
  const mb = design.stages.map((s) => (law.lossCompensation && s.meanB2 !== null ? s.meanB2 : 0));
  L.push(`static const double ${p}_MEAN_B2[${n}] = { ${mb.map((x) => cDouble(x)).join(', ')} }; /* <b^2> per stage; 0 = no loss compensation */`);
  if (angle && design.transitions.some((t) => t.when.wrapped === true)) {
    L.push(`static const double ${p}_PI = ${cDouble(Math.PI)};`);
    L.push(`static const double ${p}_TWO_PI = ${cDouble(2 * Math.PI)};`);
  }
  L.push('');
  L.push(...helperSource(p, code.helpers));
  L.push('');
  L.push('/* H and its gradient, from the design formula and its symbolic derivatives. */');
  L.push(`static void ${p}_energy_all(double q, double v, double *h, double *hq, double *hv) {`);
  if (!code.usesQ) L.push('  (void)q;');
  if (!code.usesV) L.push('  (void)v;');
  for (const line of code.lines) L.push(`  ${line}`);
  L.push(`  *h = ${code.results[0]};`);
  L.push(`  *hq = ${code.results[1]};`);
  L.push(`  *hv = ${code.results[2]};`);
  L.push('}');
  L.push('');
  L.push(`double ${p}_energy(double q, double v) {`);
  L.push('  double h, hq, hv;');
  L.push(`  ${p}_energy_all(q, v, &h, &hq, &hv);`);
  L.push('  return h;');
  L.push('}');
  L.push('');
  L.push(`void ${p}_energy_gradient(double q, double v, double grad[2]) {`);
  L.push('  double h;');
  L.push(`  ${p}_energy_all(q, v, &h, &grad[0], &grad[1]);`);
  L.push('}');
  L.push('');
  if (angle && design.transitions.some((t) => t.when.wrapped === true)) {
    L.push('/* q wrapped to [-pi, pi). */');
    L.push(`static double ${p}_wrap(double q) { return q - ${p}_TWO_PI * floor((q + ${p}_PI) / ${p}_TWO_PI); }`);
    L.push('');
  }
  if (!law.integral) {
    L.push('/* Feedback gain k(b), u_fb = -k z: the scalar SDRE 2 lambda p - (beta^2/R) p^2 + Q = 0 with');
    L.push(' * beta^2 = b^2 + eps^2, u = -(b p / R) z (engine/control/energy-gain.ts). */');
    L.push(`static double ${p}_gain(double b) {`);
    L.push(`  double beta, s;`);
    L.push(`  if (${p}_LAMBDA == 0.0) {`);
    L.push(`    return ${p}_EPS == 0.0 ? sqrt(${p}_Q / ${p}_R) * ${p}_sign(b) : (sqrt(${p}_Q / ${p}_R) * b) / hypot(b, ${p}_EPS);`);
    L.push('  }');
    L.push(`  beta = ${p}_EPS == 0.0 ? fabs(b) : hypot(b, ${p}_EPS);`);
    L.push(`  s = sqrt(${p}_LAMBDA * ${p}_LAMBDA + (${p}_Q * beta * beta) / ${p}_R);`);
    L.push(`  if (${p}_LAMBDA < 0.0) return (${p}_Q * b) / (${p}_R * (s - ${p}_LAMBDA));`);
    L.push('  if (beta == 0.0) return 0.0;');
    L.push(`  return ((${p}_LAMBDA + s) * (b / beta)) / beta;`);
    L.push('}');
    L.push('');
  } else {
    L.push(...care2Source(p));
    L.push('');
  }
  L.push(`void ${p}_reset(${p}_state *s) {`);
  L.push(`  s->stage = ${design.initialStage};`);
  L.push('  s->u_prev = 0.0; s->w = 0.0; s->H = 0.0; s->z = 0.0; s->b = 0.0;');
  L.push('  s->saturated = 0; s->riccati_ok = 1; s->fault = 0; s->switches = 0; s->t_switch = 0.0;');
  L.push('}');
  L.push('');
  L.push(`double ${p}_step(${p}_state *s, double q, double v, double t) {`);
  L.push('  double h, hq, hv, hstar, b, z, ufb = 0.0, kw = 0.0, uff, cmd, u;');
  L.push('  int k, saturated;');
  L.push(`  if (s->stage < 1 || s->stage > ${n}) { s->fault = 1; s->u_prev = 0.0; return 0.0; }`);
  L.push(`  ${p}_energy_all(q, v, &h, &hq, &hv);`);
  if (design.transitions.length > 0) {
    L.push('  /* Supervisor: the first transition out of the current stage whose condition holds fires. */');
    L.push('  switch (s->stage) {');
    for (let st = 1; st <= n; st++) {
      const out = design.transitions.filter((tr) => tr.from === st);
      if (out.length === 0) continue;
      L.push(`  case ${st}:`);
      out.forEach((tr, i) => {
        L.push(`    ${i === 0 ? 'if' : '} else if'} (${conditionC(tr.when, p, angle)}) { /* ${describeCondition(tr.when).replace(/\*\//g, '* /')} */`);
        L.push(`      s->stage = ${tr.to}; s->w = 0.0; s->switches++; s->t_switch = t;`);
      });
      L.push('    }');
      L.push('    break;');
    }
    L.push('  default:');
    L.push('    break;');
    L.push('  }');
  } else {
    L.push('  (void)t;');
  }
  L.push('  k = s->stage - 1;');
  L.push(`  hstar = ${p}_TARGET[k];`);
  L.push(`  b = ${p}_G * hv;`);
  L.push('  z = h - hstar;');
  L.push('  s->riccati_ok = 1;');
  if (!law.integral) {
    L.push(`  ufb = -${p}_gain(b) * z;`);
  } else {
    L.push('  {');
    L.push(`    const double am[4] = { ${p}_LAMBDA, 0.0, 1.0, 0.0 };`);
    L.push(`    const double gm[3] = { (b * b + ${p}_EPS * ${p}_EPS) / ${p}_R, 0.0, 0.0 };`);
    L.push(`    const double qm[3] = { ${p}_Q, 0.0, ${p}_QW };`);
    L.push('    double x[3];');
    L.push(`    if (${p}_care2(am, gm, qm, x) == 0) {`);
    L.push(`      kw = (b * x[1]) / ${p}_R;`);
    L.push(`      ufb = -((b * x[0]) / ${p}_R) * z - kw * s->w;`);
    L.push('    } else {');
    L.push('      s->riccati_ok = 0;');
    L.push('    }');
    L.push('  }');
  }
  L.push(`  uff = ${p}_MEAN_B2[k] > 0.0 ? (-${p}_LAMBDA * hstar * b) / ${p}_MEAN_B2[k] : 0.0;`);
  L.push('  cmd = ufb + uff;');
  if (law.uMax !== null) L.push(`  u = cmd > ${p}_UMAX ? ${p}_UMAX : cmd < -${p}_UMAX ? -${p}_UMAX : cmd;`);
  else L.push('  u = cmd;');
  if (law.rateMax !== null) {
    L.push('  {');
    L.push(`    const double du = ${p}_RATE_MAX * ${p}_DT;`);
    L.push('    const double lo = s->u_prev - du, hi = s->u_prev + du;');
    L.push('    if (u > hi) u = hi; else if (u < lo) u = lo;');
    L.push('  }');
  }
  L.push('  saturated = u != cmd;');
  if (law.integral) {
    const clamp = law.integral.antiWindup === 'conditional';
    L.push('  {');
    L.push(`    const double dw = z * ${p}_DT;`);
    if (clamp) {
      L.push('    /* Conditional integration: frozen when limited and the increment would push further past the limit. */');
      L.push('    if (!saturated || -kw * dw * (cmd - u) <= 0.0) s->w += dw;');
    } else {
      L.push('    (void)kw; (void)cmd;');
      L.push('    s->w += dw;');
    }
    L.push('  }');
  } else {
    L.push('  (void)kw;');
  }
  L.push('  s->u_prev = u;');
  L.push('  s->H = h; s->z = z; s->b = b; s->saturated = saturated;');
  L.push('  (void)hq;');
  L.push('  return u;');
  L.push('}');
  return L.join('\n') + '\n';
}
