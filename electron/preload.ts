// Preload: exposes exactly one function per operation of the table, plus progress/menu
// listeners and cancellation. ipcRenderer itself is never exposed.
import { contextBridge, ipcRenderer, webUtils, type IpcRendererEvent } from 'electron';
import { operationNames } from '../src-main/api/table.ts';
import { CALL, CANCEL, MENU, PROGRESS } from './channels.ts';

type Reply = { ok: true; value: unknown } | { ok: false; error: { code: string; message: string } };

const ops: Record<string, (args: unknown, jobId?: string) => Promise<Reply>> = {};
for (const name of operationNames) {
  ops[name] = (args: unknown, jobId?: string) => ipcRenderer.invoke(CALL, name, args, typeof jobId === 'string' ? jobId : undefined);
}

contextBridge.exposeInMainWorld('ergostat', {
  ops: Object.freeze(ops),
  cancel: (jobId: string) => ipcRenderer.send(CANCEL, String(jobId)),
  onProgress: (listener: (p: { jobId: string; fraction: number; message: string }) => void) => {
    const wrapped = (_e: IpcRendererEvent, p: { jobId: string; fraction: number; message: string }) => listener(p);
    ipcRenderer.on(PROGRESS, wrapped);
    return () => ipcRenderer.removeListener(PROGRESS, wrapped);
  },
  onMenu: (listener: (command: string, arg?: string) => void) => {
    const wrapped = (_e: IpcRendererEvent, command: string, arg?: string) => listener(command, arg);
    ipcRenderer.on(MENU, wrapped);
    return () => ipcRenderer.removeListener(MENU, wrapped);
  },
  /** The path of a dropped file (sandboxed renderers have no File.path). */
  pathForFile: (file: File) => webUtils.getPathForFile(file),
});
