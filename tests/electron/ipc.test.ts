// The IPC gate: calls from anything but our window are refused, arguments are validated against
// the operation table before a handler runs, errors come back as plain objects.
import { describe, expect, it, vi } from 'vitest';
import { wireIpc } from '../../electron/ipc.ts';
import { CALL, CANCEL } from '../../electron/channels.ts';

function fakeIpc() {
  const handles = new Map<string, (...a: any[]) => unknown>();
  const ons = new Map<string, (...a: any[]) => unknown>();
  return {
    handle: (ch: string, f: (...a: any[]) => unknown) => handles.set(ch, f),
    on: (ch: string, f: (...a: any[]) => unknown) => ons.set(ch, f),
    handles,
    ons,
  };
}

const origin = 'file:///app/out/renderer/';
const ours = { id: 1, isDestroyed: () => false, send: vi.fn() };
const event = (sender: object, url = origin + 'index.html') => ({ sender, senderFrame: { url } });

describe('wireIpc', () => {
  it('runs a valid call from our window', async () => {
    const ipc = fakeIpc();
    wireIpc(ipc as never, { 'app.info': () => ({ name: 'Ergostat', version: 'x', projectSchema: 1, cautions: [] }) }, { appOrigin: origin, trusted: (wc) => wc === (ours as never) });
    const r = await ipc.handles.get(CALL)!(event(ours), 'app.info', {});
    expect(r).toEqual({ ok: true, value: { name: 'Ergostat', version: 'x', projectSchema: 1, cautions: [] } });
  });
  it('refuses a call from another web contents or another page', async () => {
    const ipc = fakeIpc();
    const handler = vi.fn();
    wireIpc(ipc as never, { 'app.info': handler }, { appOrigin: origin, trusted: (wc) => wc === (ours as never) });
    const stranger = { id: 2, isDestroyed: () => false, send: vi.fn() };
    const r1: any = await ipc.handles.get(CALL)!(event(stranger), 'app.info', {});
    expect(r1.error.code).toBe('forbidden');
    const r2: any = await ipc.handles.get(CALL)!(event(ours, 'https://evil.example/'), 'app.info', {});
    expect(r2.error.code).toBe('forbidden');
    expect(handler).not.toHaveBeenCalled();
  });
  it('validates the arguments before the handler runs and names the bad field', async () => {
    const ipc = fakeIpc();
    const handler = vi.fn();
    wireIpc(ipc as never, { 'project.open': handler }, { appOrigin: origin, trusted: () => true });
    const r: any = await ipc.handles.get(CALL)!(event(ours), 'project.open', { path: 42 });
    expect(r.ok).toBe(false);
    expect(r.error.code).toBe('bad-arguments');
    expect(r.error.message).toContain('arguments.path');
    const r2: any = await ipc.handles.get(CALL)!(event(ours), 'project.open', { path: 'a.ergostat', extra: 1 });
    expect(r2.error.message).toContain('arguments.extra');
    const r3: any = await ipc.handles.get(CALL)!(event(ours), 'constructor', {});
    expect(r3.error.code).toBe('unknown-operation');
    expect(handler).not.toHaveBeenCalled();
  });
  it('cancels a long call by its job id', async () => {
    const ipc = fakeIpc();
    let seen: AbortSignal | undefined;
    wireIpc(ipc as never, {
      'recordings.importFiles': (_a, ctx) => new Promise((_res, rej) => {
        seen = ctx.signal;
        ctx.signal.addEventListener('abort', () => rej(new Error('cancelled by the user')));
      }),
    }, { appOrigin: origin, trusted: () => true });
    const pending = ipc.handles.get(CALL)!(event(ours), 'recordings.importFiles', { files: ['a.csv'], mapping: { time: 't', position: 'q' } }, 'job-1') as Promise<any>;
    await new Promise((r) => setTimeout(r, 5));
    ipc.ons.get(CANCEL)!({ sender: ours }, 'job-1');
    const r = await pending;
    expect(seen?.aborted).toBe(true);
    expect(r.ok).toBe(false);
    expect(r.error.message).toContain('cancelled');
  });
});
