// Electron main process: one hardened window, menus, dialogs, single instance, the IPC gate.
// Everything that computes or stores lives in src-main/ and is reached through the operation table.
import { app, BrowserWindow, dialog, ipcMain, Menu, session, shell, type MenuItemConstructorOptions } from 'electron';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { createHandlers } from '../src-main/api/handlers.ts';
import { MENU, type MenuCommand } from './channels.ts';
import { hardenContents, hardenSession, secureWebPreferences } from './harden.ts';
import { wireIpc } from './ipc.ts';
import { loadRecent, pushRecent, saveRecent } from './recent.ts';

// The main bundle is an ES module: derive its folder from import.meta.url.
const here = fileURLToPath(new URL('.', import.meta.url));
let mainWindow: BrowserWindow | null = null;
let recent: string[] = [];
const recentFile = () => join(app.getPath('userData'), 'recent-projects.json');

function rememberProject(path: string): void {
  recent = pushRecent(recent, path);
  saveRecent(recentFile(), recent);
  app.addRecentDocument(path);
  buildMenu();
}
let pendingOpen: string | null = process.argv.find((a) => a.endsWith('.ergostat')) ?? null;

function rendererUrl(): string {
  const dev = process.env.ELECTRON_RENDERER_URL;
  return dev ?? pathToFileURL(join(here, '../renderer/index.html')).href;
}

function appOrigin(): string {
  const dev = process.env.ELECTRON_RENDERER_URL;
  return dev ?? pathToFileURL(join(here, '../renderer/')).href;
}

function send(command: MenuCommand, arg?: string): void {
  mainWindow?.webContents.send(MENU, command, arg);
}

function buildMenu(): void {
  const isMac = process.platform === 'darwin';
  const recentItems: MenuItemConstructorOptions[] = recent.length === 0
    ? [{ label: 'No recent projects', enabled: false }]
    : [
        ...recent.map((p) => ({ label: p, click: () => send('open-recent', p) })),
        { type: 'separator' as const },
        { label: 'Clear Recent', click: () => { recent = []; saveRecent(recentFile(), recent); app.clearRecentDocuments(); buildMenu(); } },
      ];
  const template: MenuItemConstructorOptions[] = [
    ...(isMac ? [{ role: 'appMenu' as const }] : []),
    {
      label: 'File',
      submenu: [
        { label: 'New Project', accelerator: 'CmdOrCtrl+N', click: () => send('new') },
        { label: 'Open…', accelerator: 'CmdOrCtrl+O', click: () => send('open') },
        { label: 'Open Recent', submenu: recentItems },
        { type: 'separator' },
        { label: 'Save', accelerator: 'CmdOrCtrl+S', click: () => send('save') },
        { label: 'Save As…', accelerator: 'Shift+CmdOrCtrl+S', click: () => send('save-as') },
        { type: 'separator' },
        { label: 'Export…', accelerator: 'CmdOrCtrl+E', click: () => send('export') },
        { type: 'separator' },
        isMac ? { role: 'close' } : { role: 'quit' },
      ],
    },
    { role: 'editMenu' },
    { role: 'viewMenu' },
    { role: 'windowMenu' },
  ];
  Menu.setApplicationMenu(Menu.buildFromTemplate(template));
}

function createWindow(): void {
  mainWindow = new BrowserWindow({
    width: 1360,
    height: 880,
    minWidth: 960,
    minHeight: 640,
    title: 'Ergostat',
    show: false,
    backgroundColor: '#f7f6f2',
    webPreferences: secureWebPreferences(join(here, '../preload/preload.cjs')),
  });
  hardenContents(mainWindow.webContents, appOrigin());
  mainWindow.once('ready-to-show', () => mainWindow?.show());
  mainWindow.on('close', (event) => {
    // The renderer tracks unsaved changes through project.state; ask before losing them.
    const win = mainWindow;
    if (!win || (win as unknown as { allowClose?: boolean }).allowClose) return;
    event.preventDefault();
    void win.webContents
      .executeJavaScript('Boolean(window.__ergostatDirty)', false)
      .catch(() => false)
      .then((dirty: boolean) => {
        if (dirty) {
          const choice = dialog.showMessageBoxSync(win, {
            type: 'question',
            buttons: ['Discard changes', 'Cancel'],
            defaultId: 1,
            cancelId: 1,
            message: 'The project has unsaved changes.',
            detail: 'Close Ergostat and discard them?',
          });
          if (choice !== 0) return;
        }
        (win as unknown as { allowClose?: boolean }).allowClose = true;
        win.close();
      });
  });
  void mainWindow.loadURL(rendererUrl());
  mainWindow.webContents.once('did-finish-load', () => {
    if (pendingOpen) send('open-recent', pendingOpen);
    pendingOpen = null;
  });
}

if (!app.requestSingleInstanceLock()) {
  app.quit();
} else {
  app.on('second-instance', (_event, argv) => {
    const file = argv.find((a) => a.endsWith('.ergostat'));
    if (mainWindow) {
      if (mainWindow.isMinimized()) mainWindow.restore();
      mainWindow.focus();
      if (file) send('open-recent', file);
    }
  });
  app.on('open-file', (event, file) => {
    event.preventDefault();
    if (mainWindow) send('open-recent', file);
    else pendingOpen = file;
  });
  app.whenReady().then(() => {
    hardenSession(session.defaultSession);
    recent = loadRecent(recentFile());
    const handlers = createHandlers();
    // Opening or saving a project puts it at the top of File > Open Recent.
    const open = handlers['project.open']!;
    const save = handlers['project.save']!;
    handlers['project.open'] = async (args, ctx) => {
      const r = await open(args, ctx);
      rememberProject(args.path);
      return r;
    };
    handlers['project.save'] = async (args, ctx) => {
      const r = await save(args, ctx);
      if (r.path) rememberProject(r.path);
      return r;
    };
    handlers['dialog.open'] = async ({ kind }) => {
      const filters = kind === 'project' ? [{ name: 'Ergostat project', extensions: ['ergostat'] }] : [{ name: 'Recordings', extensions: ['csv', 'txt', 'tsv'] }];
      const r = await dialog.showOpenDialog(mainWindow!, { properties: kind === 'project' ? ['openFile'] : ['openFile', 'multiSelections'], filters });
      return { paths: r.canceled ? [] : r.filePaths };
    };
    handlers['dialog.save'] = async ({ kind, suggestedName }) => {
      const ext = kind === 'project' ? 'ergostat' : kind;
      const r = await dialog.showSaveDialog(mainWindow!, { defaultPath: suggestedName, filters: [{ name: ext.toUpperCase(), extensions: [ext] }] });
      return { path: r.canceled || !r.filePath ? null : r.filePath };
    };
    handlers['dialog.folder'] = async () => {
      const r = await dialog.showOpenDialog(mainWindow!, { properties: ['openDirectory', 'createDirectory'] });
      return { path: r.canceled || !r.filePaths[0] ? null : r.filePaths[0] };
    };
    wireIpc(ipcMain, handlers, { appOrigin: appOrigin(), trusted: (wc) => mainWindow !== null && wc.id === mainWindow.webContents.id });
    buildMenu();
    createWindow();
  });
  app.on('window-all-closed', () => app.quit());
  // Links in help text open in the system browser, never inside the app.
  app.on('web-contents-created', (_e, contents) => contents.setWindowOpenHandler(({ url }) => {
    if (url.startsWith('https://')) void shell.openExternal(url);
    return { action: 'deny' };
  }));
}
