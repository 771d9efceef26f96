// The Monte Carlo worker: receives run indices, draws that run's parameter mismatch from
// (seed, index), runs the trial and posts the outcome back. All state comes from workerData.
import { parentPort, workerData } from 'node:worker_threads';
import { runMonteCarloTrial } from './run-one.ts';
import type { RunRequest, WorkerReply, WorkerSetup } from './protocol.ts';

const setup = workerData as WorkerSetup;
const port = parentPort;
if (!port) throw new Error('trial-workers/worker.ts must run in a worker thread');
port.on('message', (msg: RunRequest) => {
  if (msg?.type !== 'run') return;
  let reply: WorkerReply;
  try {
    const { factors, outcome } = runMonteCarloTrial(setup, msg.index);
    reply = { type: 'done', index: msg.index, factors, outcome };
  } catch (e) {
    reply = { type: 'error', index: msg.index, message: e instanceof Error ? e.message : String(e) };
  }
  port.postMessage(reply);
});
