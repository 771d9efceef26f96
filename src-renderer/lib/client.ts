// The renderer's only way to the engine: the operation table, through the Electron preload
// (window.ergostat) or, in browser mode, through the test bridge's HTTP endpoint on 127.0.0.1.
import type { ArgsOf, ResultOf } from '../../src-main/api/define.ts';
import type { OperationName, Operations } from '../../src-main/api/table.ts';

type Reply = { ok: true; value: unknown } | { ok: false; error: { code: string; message: string } };

interface Bridge {
  ops: Record<string, (args: unknown, jobId?: string) => Promise<Reply>>;
  cancel(jobId: string): void;
  onProgress(listener: (p: { jobId: string; fraction: number; message: string }) => void): () => void;
  onMenu(listener: (command: string, arg?: string) => void): () => void;
  pathForFile(file: File): string;
}

declare global {
  interface Window {
    ergostat?: Bridge;
    __ergostatDirty?: boolean;
  }
}

export class CallError extends Error {
  constructor(readonly code: string, message: string) {
    super(message);
  }
}

export const isDesktop = typeof window !== 'undefined' && window.ergostat !== undefined;

let jobCounter = 0;
const progressListeners = new Map<string, (fraction: number, message: string) => void>();
let eventSource: EventSource | null = null;

function listenForProgress(): void {
  if (isDesktop) {
    window.ergostat!.onProgress((p) => progressListeners.get(p.jobId)?.(p.fraction, p.message));
  } else if (!eventSource && typeof EventSource !== 'undefined') {
    eventSource = new EventSource('/api/progress');
    eventSource.onmessage = (ev) => {
      const p = JSON.parse(ev.data) as { jobId: string; fraction: number; message: string };
      progressListeners.get(p.jobId)?.(p.fraction, p.message);
    };
  }
}

async function send(name: string, args: unknown, jobId?: string): Promise<Reply> {
  if (isDesktop) return window.ergostat!.ops[name](args, jobId);
  const res = await fetch('/api/call', {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ name, args, jobId }),
  });
  return (await res.json()) as Reply;
}

export interface CallOptions {
  onProgress?: (fraction: number, message: string) => void;
  signal?: AbortSignal;
}

export async function call<N extends OperationName>(name: N, args: ArgsOf<Operations[N]>, opts: CallOptions = {}): Promise<ResultOf<Operations[N]>> {
  let jobId: string | undefined;
  if (opts.onProgress || opts.signal) {
    jobId = `job-${Date.now()}-${++jobCounter}`;
    listenForProgress();
    if (opts.onProgress) progressListeners.set(jobId, opts.onProgress);
    opts.signal?.addEventListener('abort', () => cancel(jobId!));
  }
  try {
    const reply = await send(name, args, jobId);
    if (!reply.ok) throw new CallError(reply.error.code, reply.error.message);
    return reply.value as ResultOf<Operations[N]>;
  } finally {
    if (jobId) progressListeners.delete(jobId);
  }
}

function cancel(jobId: string): void {
  if (isDesktop) window.ergostat!.cancel(jobId);
  else void fetch('/api/cancel', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ jobId }) });
}
