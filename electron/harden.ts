// Window hardening, in one reviewed place: isolated, sandboxed renderer without Node; a strict
// Content Security Policy; no navigation away from the app, no new windows, no permissions.
// Follows Electron's security checklist (electronjs.org/docs/latest/tutorial/security).
import type { BrowserWindowConstructorOptions, Session, WebContents } from 'electron';

/** CSP for the app's own pages: our scripts and styles only; images may be data:/blob: URLs (plots). */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'none'",
  "script-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "base-uri 'none'",
  "form-action 'none'",
  "frame-ancestors 'none'",
  "object-src 'none'",
].join('; ');

export function secureWebPreferences(preloadPath: string): NonNullable<BrowserWindowConstructorOptions['webPreferences']> {
  return {
    preload: preloadPath,
    contextIsolation: true,
    sandbox: true,
    nodeIntegration: false,
    nodeIntegrationInWorker: false,
    nodeIntegrationInSubFrames: false,
    webSecurity: true,
    allowRunningInsecureContent: false,
    experimentalFeatures: false,
    webviewTag: false,
    navigateOnDragDrop: false,
    spellcheck: false,
  };
}

/** True when url is one of the app's own pages (the packaged file or the dev server). */
export function isAppUrl(url: string, appOrigin: string): boolean {
  try {
    const u = new URL(url);
    if (appOrigin.startsWith('file://')) return u.protocol === 'file:' && url.startsWith(appOrigin);
    return u.origin === new URL(appOrigin).origin;
  } catch {
    return false;
  }
}

/** Blocks navigation, new windows and webviews for one window's contents. */
export function hardenContents(contents: WebContents, appOrigin: string): void {
  contents.on('will-navigate', (event, url) => {
    if (!isAppUrl(url, appOrigin)) event.preventDefault();
  });
  contents.on('will-redirect', (event, url) => {
    if (!isAppUrl(url, appOrigin)) event.preventDefault();
  });
  contents.on('will-attach-webview', (event) => event.preventDefault());
  contents.setWindowOpenHandler(() => ({ action: 'deny' }));
}

/** Denies every permission request and check, and adds the CSP header to every response. */
export function hardenSession(session: Session): void {
  session.setPermissionRequestHandler((_wc, _permission, callback) => callback(false));
  session.setPermissionCheckHandler(() => false);
  session.webRequest.onHeadersReceived((details, callback) => {
    callback({ responseHeaders: { ...details.responseHeaders, 'Content-Security-Policy': [CONTENT_SECURITY_POLICY] } });
  });
  // Offline by design: refuse every request that is not for the app's own files.
  session.webRequest.onBeforeRequest((details, callback) => {
    const u = details.url;
    const local = u.startsWith('file://') || u.startsWith('devtools://') || u.startsWith('data:') || u.startsWith('blob:') || /^https?:\/\/(localhost|127\.0\.0\.1)(:\d+)?\//.test(u);
    callback({ cancel: !local });
  });
}
