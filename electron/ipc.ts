// Main-process IPC wiring: the sender check, then the gatekeeper (src-main/api/gate.ts), for
// every call. Long operations get an AbortController keyed by the caller's job id.
import type { IpcMain, IpcMainInvokeEvent, WebContents } from 'electron';
import { callOperation, serializeError, type Handlers } from '../src-main/api/gate.ts';
import { operations, type Operations } from '../src-main/api/table.ts';
import { CALL, CANCEL, PROGRESS } from './channels.ts';
import { isAppUrl } from './harden.ts';

export interface IpcOptions {
  appOrigin: string;
  /** The web contents of our own window(s); calls from anything else are refused. */
  trusted: (contents: WebContents) => boolean;
}

export function wireIpc(ipcMain: IpcMain, handlers: Partial<Handlers<Operations>>, opts: IpcOptions): void {
  const jobs = new Map<string, AbortController>();

  ipcMain.handle(CALL, async (event: IpcMainInvokeEvent, name: unknown, args: unknown, jobId: unknown) => {
    const frameUrl = event.senderFrame?.url ?? '';
    if (!opts.trusted(event.sender) || !isAppUrl(frameUrl, opts.appOrigin)) {
      return { ok: false, error: { code: 'forbidden', message: 'call refused: not from the Ergostat window' } };
    }
    const key = typeof jobId === 'string' && jobId.length <= 64 ? jobId : undefined;
    const controller = new AbortController();
    if (key) jobs.set(key, controller);
    try {
      const value = await callOperation(operations, handlers, name, args, {
        signal: controller.signal,
        progress: (p) => {
          if (key && !event.sender.isDestroyed()) event.sender.send(PROGRESS, { jobId: key, fraction: p.fraction, message: p.message });
        },
      });
      return { ok: true, value };
    } catch (e) {
      return { ok: false, error: serializeError(e) };
    } finally {
      if (key) jobs.delete(key);
    }
  });

  ipcMain.on(CANCEL, (event, jobId: unknown) => {
    if (!opts.trusted(event.sender) || typeof jobId !== 'string') return;
    jobs.get(jobId)?.abort();
  });
}
