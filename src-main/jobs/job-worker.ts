// Runs one engine job inside a worker thread: reads {kind, payload} from workerData, posts the
// result (or the error message) to the parent and exits.
import { parentPort, workerData } from 'node:worker_threads';
import type { JobKinds, JobMessage } from './kinds.ts';
import { learnEnergy } from '../engine/learn/index.ts';
import { designLevelHold } from '../design/level-hold.ts';
import { designWellHop } from '../design/hop.ts';
import { runDesignTrial } from '../design/run-trial.ts';

type Input = { [K in keyof JobKinds]: { kind: K; payload: JobKinds[K]['payload'] } }[keyof JobKinds];

function post(m: JobMessage): void {
  parentPort!.postMessage(m);
}

try {
  const input = workerData as Input;
  switch (input.kind) {
    case 'learn': {
      post({ type: 'progress', fraction: NaN, message: 'learning the energy' });
      post({ type: 'done', result: learnEnergy(input.payload.recording, input.payload.options) });
      break;
    }
    case 'design': {
      const p = input.payload;
      post({ type: 'progress', fraction: NaN, message: p.kind === 'well-hop' ? 'planning the hop and checking it by simulation' : 'designing the level hold' });
      post({ type: 'done', result: p.kind === 'well-hop' ? designWellHop(p.model, p.options) : designLevelHold(p.model, p.options) });
      break;
    }
    case 'trial': {
      const p = input.payload;
      // Asynchronous (its Monte Carlo waits for worker threads); no top-level await in the bundle.
      runDesignTrial(p.design, p.settings, {
        designLabel: p.designLabel,
        onProgress: (pr) => post({ type: 'progress', fraction: pr.total > 0 ? pr.done / pr.total : NaN, message: pr.message }),
      }).then(
        (result) => post({ type: 'done', result }),
        (e: unknown) => post({ type: 'failed', message: e instanceof Error ? e.message : String(e) }),
      );
      break;
    }
    default:
      post({ type: 'failed', message: `unknown job kind ${JSON.stringify((input as { kind: unknown }).kind)}` });
  }
} catch (e) {
  post({ type: 'failed', message: e instanceof Error ? e.message : String(e) });
}
