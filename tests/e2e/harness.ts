// End-to-end harness: builds the renderer (vite), serves it with the operation table on
// 127.0.0.1 (src-main/bridge), and drives Debian's Chromium through playwright-core.
// Any console error or page error fails the test; screenshots go to test-artifacts/.
import { existsSync, mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { build } from 'vite';
import { startBridge, type Bridge } from '../../src-main/bridge/server.ts';
import { createHandlers } from '../../src-main/api/handlers.ts';

export const CHROMIUM = process.env.ERGOSTAT_CHROMIUM ?? '/usr/bin/chromium';
export const ARTIFACTS = resolve(import.meta.dirname, '../../test-artifacts');
export const chromiumAvailable = existsSync(CHROMIUM);

export interface E2E {
  bridge: Bridge;
  browser: Browser;
  page: Page;
  consoleErrors: string[];
  shot(name: string): Promise<string>;
  close(): Promise<void>;
}

let built = false;

export async function buildRenderer(): Promise<string> {
  const outDir = resolve(import.meta.dirname, '../../dist');
  if (!built) {
    await build({ configFile: resolve(import.meta.dirname, '../../vite.config.ts'), logLevel: 'warn' });
    built = true;
  }
  return outDir;
}

export async function startE2E(): Promise<E2E> {
  const staticDir = await buildRenderer();
  const bridge = await startBridge({ staticDir, handlers: createHandlers() });
  const browser = await chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    timeout: 60_000,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
  });
  const context = await browser.newContext({ viewport: { width: 1360, height: 900 } });
  const page = await context.newPage();
  const consoleErrors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') consoleErrors.push(m.text());
  });
  page.on('pageerror', (e) => consoleErrors.push(e.message));
  mkdirSync(ARTIFACTS, { recursive: true });
  await page.goto(bridge.url);
  return {
    bridge,
    browser,
    page,
    consoleErrors,
    async shot(name) {
      const file = join(ARTIFACTS, `${name}.png`);
      await page.screenshot({ path: file, fullPage: true });
      return file;
    },
    async close() {
      await browser.close();
      await bridge.close();
    },
  };
}
