// Window hardening per Electron's security checklist (electronjs.org/docs/latest/tutorial/security):
// each setting is checked on the values our code hands to Electron, with Electron mocked.
import { describe, expect, it, vi } from 'vitest';
import { CONTENT_SECURITY_POLICY, hardenContents, hardenSession, isAppUrl, secureWebPreferences } from '../../electron/harden.ts';

type Listener = (...args: any[]) => void;

function fakeContents() {
  const listeners = new Map<string, Listener>();
  let openHandler: ((d: { url: string }) => { action: string }) | undefined;
  return {
    on: (name: string, fn: Listener) => listeners.set(name, fn),
    setWindowOpenHandler: (fn: (d: { url: string }) => { action: string }) => (openHandler = fn),
    fire: (name: string, ...args: unknown[]) => listeners.get(name)?.(...args),
    open: (url: string) => openHandler?.({ url }),
  };
}

describe('secureWebPreferences', () => {
  it('turns on context isolation and the sandbox and keeps Node out of the renderer', () => {
    const p = secureWebPreferences('/app/preload.mjs');
    expect(p.contextIsolation).toBe(true);
    expect(p.sandbox).toBe(true);
    expect(p.nodeIntegration).toBe(false);
    expect(p.nodeIntegrationInWorker).toBe(false);
    expect(p.webSecurity).toBe(true);
    expect(p.allowRunningInsecureContent).toBe(false);
    expect(p.webviewTag).toBe(false);
    expect(p.preload).toBe('/app/preload.mjs');
  });
});

describe('hardenContents', () => {
  const origin = 'file:///opt/ergostat/resources/app/out/renderer/';
  it('blocks navigation away from the app and allows its own pages', () => {
    const c = fakeContents();
    hardenContents(c as never, origin);
    const away = { preventDefault: vi.fn() };
    c.fire('will-navigate', away, 'https://example.org/');
    expect(away.preventDefault).toHaveBeenCalled();
    const own = { preventDefault: vi.fn() };
    c.fire('will-navigate', own, origin + 'index.html');
    expect(own.preventDefault).not.toHaveBeenCalled();
    const other = { preventDefault: vi.fn() };
    c.fire('will-navigate', other, 'file:///etc/passwd');
    expect(other.preventDefault).toHaveBeenCalled();
  });
  it('denies every new window and webview', () => {
    const c = fakeContents();
    hardenContents(c as never, origin);
    expect(c.open('https://example.org/')).toEqual({ action: 'deny' });
    expect(c.open(origin + 'index.html')).toEqual({ action: 'deny' });
    const ev = { preventDefault: vi.fn() };
    c.fire('will-attach-webview', ev);
    expect(ev.preventDefault).toHaveBeenCalled();
  });
});

describe('hardenSession', () => {
  it('denies permissions, sets the CSP header and refuses remote requests', () => {
    let perm: any, check: any, headers: any, before: any;
    const s = {
      setPermissionRequestHandler: (f: unknown) => (perm = f),
      setPermissionCheckHandler: (f: unknown) => (check = f),
      webRequest: { onHeadersReceived: (f: unknown) => (headers = f), onBeforeRequest: (f: unknown) => (before = f) },
    };
    hardenSession(s as never);
    const cb = vi.fn();
    perm(null, 'media', cb);
    expect(cb).toHaveBeenCalledWith(false);
    expect(check(null, 'geolocation')).toBe(false);
    const hcb = vi.fn();
    headers({ responseHeaders: { 'X-Other': ['1'] } }, hcb);
    expect(hcb.mock.calls[0][0].responseHeaders['Content-Security-Policy']).toEqual([CONTENT_SECURITY_POLICY]);
    expect(hcb.mock.calls[0][0].responseHeaders['X-Other']).toEqual(['1']);
    const bcb = vi.fn();
    before({ url: 'https://example.org/x.js' }, bcb);
    expect(bcb).toHaveBeenLastCalledWith({ cancel: true });
    before({ url: 'file:///opt/ergostat/out/renderer/index.html' }, bcb);
    expect(bcb).toHaveBeenLastCalledWith({ cancel: false });
  });
  it('has a CSP without remote sources or inline scripts', () => {
    expect(CONTENT_SECURITY_POLICY).toContain("default-src 'none'");
    expect(CONTENT_SECURITY_POLICY).toMatch(/script-src 'self'(;|$)/);
    expect(CONTENT_SECURITY_POLICY).not.toMatch(/https?:/);
  });
});

describe('isAppUrl', () => {
  it('accepts the dev server origin only', () => {
    expect(isAppUrl('http://localhost:5173/index.html', 'http://localhost:5173')).toBe(true);
    expect(isAppUrl('http://localhost:5174/index.html', 'http://localhost:5173')).toBe(false);
    expect(isAppUrl('not a url', 'http://localhost:5173')).toBe(false);
  });
});
