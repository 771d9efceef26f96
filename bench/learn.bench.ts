// Energy-map learning bench (issue 3): the streamed weak-form Gram accumulation and the
// generalized eigen-solve on 1,000,000 and 10,000,000 samples of a 2-state system (damped
// double-well Duffing, several runs) with the degree-6 monomial library (27 terms, odd powers of
// v included) and three pooled lags; plus the whole learnEnergy pipeline on 1,000,000
// position-only samples. Where python3 with numpy is available, the same Gram accumulation
// (same chunks, same lags) and generalized eigen-solve run in numpy on the same data, passed
// through a temporary binary file, and the ratio is printed. Peak memory is the process's
// maximum resident set size (getrusage) after each stage.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { accumulateGrams, addGramSet, buildLibrary, emptyGramSet, learnEnergy, solveWeak } from '../src-main/engine/learn/index.ts';

const emit = (name: string, value: number, unit: string, extra: Record<string, unknown> = {}) =>
  console.log(JSON.stringify({ name, value: Number(value.toPrecision(6)), unit, ...extra }));
const peakMB = () => process.resourceUsage().maxRSS / 1024;

const DT = 0.01;
const LAGS = [31, 57, 89];
const terms = buildLibrary({ coordinate: 'linear', degree: 6 });

/** Damped Duffing q'' = q - q^3 - 0.01 q' integrated by RK4 straight into the output arrays. */
function duffingStates(n: number, runs: number, spread = false): { q: Float64Array; v: Float64Array; runLength: number } {
  const q = new Float64Array(n), v = new Float64Array(n);
  const len = Math.floor(n / runs);
  const f = (x: number, y: number) => x - x * x * x - 0.01 * y;
  for (let r = 0; r < runs; r++) {
    // spread: initial states over both wells and above the barrier; else all in one well.
    let x = spread ? -1.8 + (3.6 * r) / runs : 0.3 + (1.4 * r) / runs, y = spread ? 0.3 * (r % 5) - 0.6 : 0.2 * (r % 3);
    const h = DT;
    for (let i = r * len; i < (r === runs - 1 ? n : (r + 1) * len); i++) {
      q[i] = x; v[i] = y;
      const k1x = y, k1y = f(x, y);
      const k2x = y + 0.5 * h * k1y, k2y = f(x + 0.5 * h * k1x, y + 0.5 * h * k1y);
      const k3x = y + 0.5 * h * k2y, k3y = f(x + 0.5 * h * k2x, y + 0.5 * h * k2y);
      const k4x = y + h * k3y, k4y = f(x + h * k3x, y + h * k3y);
      x += (h / 6) * (k1x + 2 * k2x + 2 * k3x + k4x);
      y += (h / 6) * (k1y + 2 * k2y + 2 * k3y + k4y);
    }
  }
  return { q, v, runLength: len };
}

function jsCore(q: Float64Array, v: Float64Array, runs: number): { seconds: number; cpu: number; mu1: number } {
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  const len = Math.floor(q.length / runs);
  const pooled = emptyGramSet(terms.length, LAGS);
  for (let r = 0; r < runs; r++) {
    const s = r * len, e = r === runs - 1 ? q.length : (r + 1) * len;
    addGramSet(pooled, accumulateGrams(q.subarray(s, e), v.subarray(s, e), terms, LAGS));
  }
  const sol = solveWeak(pooled, DT, 0, null);
  const c = process.cpuUsage(c0);
  return { seconds: (performance.now() - t0) / 1000, cpu: (c.user + c.system) / 1e6, mu1: sol.mu[0] };
}

const PY = String.raw`
import sys, time, numpy as np
path, n, runs, p_deg = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), int(sys.argv[4])
lags = [int(x) for x in sys.argv[5].split(',')]
data = np.fromfile(path, dtype='<f8')
q, v = data[:n], data[n:]
pw = [(d - b, b) for d in range(1, p_deg + 1) for b in range(d + 1)]
P = len(pw)
def theta(qs, vs):
    qp = [np.ones_like(qs)]; vp = [np.ones_like(vs)]
    for k in range(p_deg): qp.append(qp[-1] * qs); vp.append(vp[-1] * vs)
    return np.stack([qp[a] * vp[b] for a, b in pw], axis=1)
t0 = time.perf_counter(); c0 = time.process_time()
G = np.zeros((P, P)); S = np.zeros(P); D = [np.zeros((P, P)) for _ in lags]; cnt = [0] * len(lags)
L = max(lags); chunk = 4096; ln = n // runs
for r in range(runs):
    s0, e0 = r * ln, (n if r == runs - 1 else (r + 1) * ln)
    for s in range(s0, e0, chunk):
        e = min(e0, s + chunk)
        X = theta(q[s:min(e0, e + L)], v[s:min(e0, e + L)])
        m = e - s
        G += X[:m].T @ X[:m]; S += X[:m].sum(0)
        for k, lag in enumerate(lags):
            mm = min(e, e0 - lag) - s
            if mm <= 0: continue
            dX = X[lag:lag + mm] - X[:mm]
            D[k] += dX.T @ dX; cnt[k] += mm
Ntot = float(n)
C = G / Ntot - np.outer(S / Ntot, S / Ntot)
A = sum(D) / sum(cnt)
d = 1 / np.sqrt(np.diag(C))
Lc = np.linalg.cholesky(C * np.outer(d, d))
Li = np.linalg.inv(Lc)
W = Li @ (A * np.outer(d, d)) @ Li.T
w = np.linalg.eigvalsh((W + W.T) / 2)
print(time.perf_counter() - t0, w[0], time.process_time() - c0)
`;

function numpyCore(q: Float64Array, v: Float64Array, runs: number): { seconds: number; cpu: number; mu1: number } | null {
  const probe = spawnSync('python3', ['-c', 'import numpy'], { encoding: 'utf8' });
  if (probe.status !== 0) return null;
  const dir = mkdtempSync(join(tmpdir(), 'ergostat-bench-'));
  try {
    const file = join(dir, 'qv.f64');
    const buf = new Float64Array(2 * q.length);
    buf.set(q, 0); buf.set(v, q.length);
    writeFileSync(file, new Uint8Array(buf.buffer));
    const r = spawnSync('python3', ['-c', PY, file, String(q.length), String(runs), '6', LAGS.join(',')], { encoding: 'utf8', maxBuffer: 1 << 20 });
    if (r.status !== 0) { console.error(r.stderr); return null; }
    const [sec, mu, cpu] = r.stdout.trim().split(/\s+/).map(Number);
    return { seconds: sec, cpu, mu1: mu };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// The 10M stage runs in a child process of its own so that its peak memory is its own.
const stage10M = process.env.ERGOSTAT_LEARN_BENCH_STAGE === '10M';

// 1M samples: core, numpy reference, full pipeline.
if (!stage10M) {
  const N = 1_000_000, RUNS = 10;
  const { q, v } = duffingStates(N, RUNS);
  jsCore(q.subarray(0, 50_000), v.subarray(0, 50_000), 1); // warm-up (JIT)
  const js = jsCore(q, v, RUNS);
  emit('learn.gram+eig.1M.wall', js.seconds, 's', { samples: N, terms: terms.length, lags: LAGS, mu1: js.mu1 });
  emit('learn.gram+eig.1M.cpu', js.cpu, 's', { note: 'CPU time of this process (the machine may be shared)' });
  const np = numpyCore(q, v, RUNS);
  if (np) {
    emit('learn.gram+eig.1M.numpy.wall', np.seconds, 's', { mu1: np.mu1, relativeDifferenceMu1: Math.abs(np.mu1 - js.mu1) / Math.abs(np.mu1) });
    emit('learn.gram+eig.1M.numpy.cpu', np.cpu, 's', { note: 'process CPU time (all BLAS threads)' });
    emit('learn.gram+eig.1M.ratio_js_over_numpy', js.seconds / np.seconds, 'x', { basis: 'wall time' });
    emit('learn.gram+eig.1M.ratio_js_over_numpy.cpu', js.cpu / np.cpu, 'x', { basis: 'CPU time' });
  } else {
    emit('learn.gram+eig.1M.numpy.wall', NaN, 's', { note: 'python3 with numpy not available' });
  }
  emit('learn.peak_rss.after_1M_core', peakMB(), 'MB');
}
if (!stage10M) {
  // Whole pipeline on 1M position-only samples (100 runs of 100 s, 0.2 % noise, 14-bit), default library.
  const N = 1_000_000, RUNS = 100, len = N / RUNS;
  const { q } = duffingStates(N, RUNS, true);
  let lo = Infinity, hi = -Infinity;
  for (const x of q) { lo = Math.min(lo, x); hi = Math.max(hi, x); }
  const step = (hi - lo) / 2 ** 14;
  let s = 7;
  const normal = () => { s = (s * 16807) % 2147483647; const u1 = s / 2147483647; s = (s * 16807) % 2147483647; const u2 = s / 2147483647; return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2); };
  const runs = Array.from({ length: RUNS }, (_, r) => {
    const qq = new Float64Array(len), t = new Float64Array(len);
    for (let i = 0; i < len; i++) { t[i] = i * DT; qq[i] = Math.round((q[r * len + i] + 0.002 * (hi - lo) * normal()) / step) * step; }
    return { name: `run ${r + 1}`, source: '', t, q: qq };
  });
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  const m = learnEnergy({ coordinate: 'linear', runs });
  const c = process.cpuUsage(c0);
  emit('learn.pipeline.1M.wall', (performance.now() - t0) / 1000, 's', { status: m.status, formula: m.formula, halfWindow: m.metrics.halfWindow });
  emit('learn.pipeline.1M.cpu', (c.user + c.system) / 1e6, 's');
  emit('learn.peak_rss.after_1M_pipeline', peakMB(), 'MB');
}
if (!stage10M) {
  const here = dirname(fileURLToPath(import.meta.url));
  const r = spawnSync(process.execPath, [join(here, '..', 'bin', 'run-ts.mjs'), join(here, 'learn.bench.ts')], { env: { ...process.env, ERGOSTAT_LEARN_BENCH_STAGE: '10M' }, stdio: 'inherit' });
  if (r.status !== 0) console.error(`learn bench: the 10M stage failed (exit ${r.status})`);
} else {
  const N = 10_000_000, RUNS = 10;
  const { q, v } = duffingStates(N, RUNS);
  const js = jsCore(q, v, RUNS);
  emit('learn.gram+eig.10M.wall', js.seconds, 's', { samples: N, terms: terms.length, mu1: js.mu1 });
  emit('learn.gram+eig.10M.cpu', js.cpu, 's');
  emit('learn.peak_rss.10M_core', peakMB(), 'MB', { note: 'peak of a process doing only this stage, including the 160 MB of simulated states' });
}
