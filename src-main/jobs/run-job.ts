// Starts an engine job in a worker thread and resolves with its result. Cancelling (the signal)
// terminates the thread at once: the engine's loops need no cancellation checks of their own.
// From source (tests, CLI) the worker starts from worker-entry.mjs, which installs the tsx
// loader; in the packaged app electron-vite builds job-worker.js beside the main bundle.
import { Worker } from 'node:worker_threads';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';
import type { JobKind, JobKinds, JobMessage } from './kinds.ts';

function workerFile(): string {
  const here = dirname(fileURLToPath(import.meta.url));
  const bundled = join(here, 'job-worker.js');
  if (existsSync(bundled)) return bundled;
  return join(here, 'worker-entry.mjs');
}

export class JobCancelled extends Error {
  override name = 'JobCancelled';
}

export function runJob<K extends JobKind>(
  kind: K,
  payload: JobKinds[K]['payload'],
  opts: { signal?: AbortSignal; onProgress?: (fraction: number, message: string) => void } = {},
): Promise<JobKinds[K]['result']> {
  return new Promise((resolve, reject) => {
    if (opts.signal?.aborted) {
      reject(new JobCancelled(`${kind}: cancelled`));
      return;
    }
    const worker = new Worker(workerFile(), { workerData: { kind, payload } });
    let settled = false;
    const finish = (fn: () => void) => {
      if (settled) return;
      settled = true;
      opts.signal?.removeEventListener('abort', onAbort);
      fn();
      void worker.terminate();
    };
    const onAbort = () => finish(() => reject(new JobCancelled(`${kind}: cancelled`)));
    opts.signal?.addEventListener('abort', onAbort);
    worker.on('message', (m: JobMessage) => {
      if (m.type === 'progress') opts.onProgress?.(m.fraction, m.message);
      else if (m.type === 'done') finish(() => resolve(m.result as JobKinds[K]['result']));
      else finish(() => reject(new Error(m.message)));
    });
    worker.on('error', (e) => finish(() => reject(e)));
    worker.on('exit', (code) => finish(() => reject(new Error(`${kind}: worker stopped (exit code ${code})`))));
  });
}
