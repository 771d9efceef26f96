// Monte Carlo over parameter mismatch on worker threads (node:worker_threads): N runs of one
// described trial, each plant parameter scaled by a factor drawn uniformly from [1 - p, 1 + p]
// (engine/trial/mismatch.ts). A pool of k workers takes run indices one at a time; results are
// stored by index, so the outcome depends only on the seed, never on k or on scheduling.
// Cancellation through an AbortSignal terminates every worker (Worker.terminate stops running
// JavaScript mid-trial) and waits for their exit before the promise settles.
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { buildTrial, type TrialOutcome, type TrialSpec } from '../engine/trial/trial-spec.ts';
import type { RunRequest, WorkerReply, WorkerSetup } from './protocol.ts';

export interface MonteCarloSpec {
  trial: TrialSpec;
  /** Number of runs N >= 1. */
  runs: number;
  /** Mismatch p in [0, 1): factors uniform in [1 - p, 1 + p]. */
  mismatch: number;
  /** Seed (non-negative integer). */
  seed: number;
}

export interface MonteCarloRun {
  index: number;
  factors: Record<string, number>;
  outcome: TrialOutcome;
}

export interface MonteCarloProgress {
  completed: number;
  total: number;
  converged: number;
  /** The run that just finished. */
  run: MonteCarloRun;
}

export interface MonteCarloOptions {
  /** Worker threads, 1..64. Default 1. */
  workers?: number;
  signal?: AbortSignal;
  onProgress?: (p: MonteCarloProgress) => void;
}

export interface MonteCarloResult {
  status: 'ok' | 'cancelled' | 'failed';
  message: string;
  /** Finished runs, sorted by index (all N when status is 'ok'). */
  runs: MonteCarloRun[];
  completed: number;
  convergedCount: number;
  /** convergedCount / completed (NaN when nothing completed). */
  convergedShare: number;
  diagnostics: { workers: number; wallMs: number; workersStarted: number; workersExited: number };
}

// From source the worker starts from worker-entry.mjs (installs the tsx loader); in the packaged
// app electron-vite builds trial-worker.js beside the main bundle (electron.vite.config.ts).
const BUNDLED = new URL('./trial-worker.js', import.meta.url);
const ENTRY = existsSync(fileURLToPath(BUNDLED)) ? BUNDLED : new URL('./worker-entry.mjs', import.meta.url);

export function runMonteCarlo(spec: MonteCarloSpec, options: MonteCarloOptions = {}): Promise<MonteCarloResult> {
  if (typeof spec !== 'object' || spec === null) throw new TypeError('monteCarlo: spec must be an object {trial, runs, mismatch, seed}');
  if (!Number.isInteger(spec.runs) || spec.runs < 1) throw new RangeError(`monteCarlo: runs must be an integer >= 1, got ${spec.runs}`);
  if (!(spec.mismatch >= 0 && spec.mismatch < 1)) throw new RangeError(`monteCarlo: mismatch must be in [0, 1), got ${spec.mismatch}`);
  if (!Number.isSafeInteger(spec.seed) || spec.seed < 0) throw new RangeError(`monteCarlo: seed must be a non-negative integer, got ${spec.seed}`);
  const nWorkers = options.workers ?? 1;
  if (!Number.isInteger(nWorkers) || nWorkers < 1 || nWorkers > 64) throw new RangeError(`monteCarlo: workers must be an integer in 1..64, got ${options.workers}`);
  buildTrial(spec.trial); // validate once at the door, in this thread, with field names
  const { signal, onProgress } = options;
  const t0 = performance.now();
  const k = Math.min(nWorkers, spec.runs);
  const setup: WorkerSetup = { trial: spec.trial, mismatch: spec.mismatch, seed: spec.seed };

  return new Promise<MonteCarloResult>((resolve) => {
    const results: (MonteCarloRun | undefined)[] = new Array(spec.runs);
    const workers: Worker[] = [];
    const exits: Promise<void>[] = [];
    let exited = 0;
    let next = 0, completed = 0, converged = 0;
    let finished = false;

    const finish = (status: MonteCarloResult['status'], message: string) => {
      if (finished) return;
      finished = true;
      signal?.removeEventListener('abort', onAbort);
      for (const w of workers) void w.terminate();
      void Promise.all(exits).then(() => {
        const runs = results.filter((r): r is MonteCarloRun => r !== undefined);
        resolve({
          status, message, runs, completed, convergedCount: converged,
          convergedShare: completed > 0 ? converged / completed : NaN,
          diagnostics: { workers: k, wallMs: performance.now() - t0, workersStarted: workers.length, workersExited: exited },
        });
      });
    };
    const onAbort = () => finish('cancelled', `cancelled after ${completed} of ${spec.runs} runs`);
    if (signal?.aborted) {
      finish('cancelled', 'cancelled before the first run');
      return;
    }
    signal?.addEventListener('abort', onAbort, { once: true });

    const feed = (w: Worker) => {
      if (next < spec.runs) w.postMessage({ type: 'run', index: next++ } satisfies RunRequest);
    };
    for (let i = 0; i < k; i++) {
      const w = new Worker(ENTRY, { workerData: setup });
      workers.push(w);
      exits.push(new Promise<void>((res) => w.once('exit', () => { exited++; res(); })));
      w.on('message', (msg: WorkerReply) => {
        if (finished) return;
        if (msg.type === 'error') {
          finish('failed', `run ${msg.index}: ${msg.message}`);
          return;
        }
        const run: MonteCarloRun = { index: msg.index, factors: msg.factors, outcome: msg.outcome };
        results[msg.index] = run;
        completed++;
        if (run.outcome.converged) converged++;
        onProgress?.({ completed, total: spec.runs, converged, run });
        if (completed === spec.runs) finish('ok', `${converged} of ${completed} runs converged`);
        else feed(w);
      });
      w.on('error', (err) => finish('failed', `worker ${i}: ${err instanceof Error ? err.message : String(err)}`));
      w.on('exit', (code) => { if (!finished && code !== 0) finish('failed', `worker ${i} exited with code ${code}`); });
      feed(w);
    }
  });
}
