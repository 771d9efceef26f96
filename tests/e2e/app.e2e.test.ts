// The app in a real browser (Debian's Chromium, headless) against the built renderer and the
// operation table served on 127.0.0.1. CI installs Chromium; elsewhere the suite is skipped
// with a message when /usr/bin/chromium is missing.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromiumAvailable, startE2E, type E2E } from './harness.ts';

const required = process.env.CI === 'true';
if (!chromiumAvailable && !required) console.warn('e2e: /usr/bin/chromium not found; skipping browser tests (apt-get install chromium)');

describe.skipIf(!chromiumAvailable && !required)('app in a real browser', () => {
  let e: E2E;
  beforeAll(async () => {
    e = await startE2E();
  }, 120_000);
  afterAll(async () => {
    await e?.close();
  });

  it('starts, shows the five steps and the version from the engine', async () => {
    const { page } = e;
    await page.waitForSelector('nav .brand');
    const steps = await page.locator('nav .step').allInnerTexts();
    expect(steps.map((s) => s.replace(/^\d+\s*/, '').trim())).toEqual(['Recordings', 'Energy map', 'Controller', 'Trials', 'Export']);
    await page.waitForSelector('text=v0.1.0');
    await e.shot('01-start');
    expect(e.consoleErrors.join("\n")).toBe("");
  });

  it('imports a CSV through the file input and draws the run', async () => {
    const { page } = e;
    const lines = ['t,theta'];
    for (let i = 0; i < 2000; i++) lines.push(`${(i / 200).toFixed(4)},${(0.6 * Math.cos(2 * Math.PI * 0.7 * i / 200)).toFixed(5)}`);
    await page.fill('input[name=time-column]', 't');
    await page.fill('input[name=position-column]', 'theta');
    await page.check('input[name=angle]');
    await page.setInputFiles('[data-testid=csv-input]', { name: 'bench-swing.csv', mimeType: 'text/csv', buffer: Buffer.from(lines.join('\n') + '\n') });
    await page.waitForSelector('[data-recording="bench-swing"]');
    const cells = await page.locator('[data-recording="bench-swing"] td.num').allInnerTexts();
    expect(cells[0]).toBe('2000');
    expect(cells[1]).toBe('200.0');
    await page.waitForSelector('[data-testid=trace-plot] path[data-series=position]');
    await e.shot('02-recordings');
    expect(e.consoleErrors.join("\n")).toBe("");
  });

  it('adds the demo pendulum, learns its energy and draws the energy map', async () => {
    const { page } = e;
    await page.click('[data-testid=demo-pendulum]');
    await page.waitForSelector('[data-recording="larkspur-pendulum"]');
    await page.click('[data-step=energy]');
    await page.selectOption('select[name=learn-recording]', 'larkspur-pendulum');
    await page.click('[data-testid=learn]');
    await page.waitForSelector('[data-testid=formula]', { timeout: 90_000 });
    const formula = await page.locator('[data-testid=formula]').innerText();
    expect(formula).toMatch(/cos\(q\)/);
    expect(formula).toMatch(/v\^2/);
    await page.waitForSelector('[data-testid=phase-plot] path.level');
    await page.waitForSelector('[data-testid=potential-plot] path[data-series=V]');
    await e.shot('03-energy-map');
    expect(e.consoleErrors.join("\n")).toBe("");
  }, 120_000);

  it('designs a level hold for the learned pendulum and shows its checks and the cautions', async () => {
    const { page } = e;
    await page.click('[data-step=controller]');
    await page.selectOption('select[name=target-kind]', 'amplitude');
    await page.fill('input[name=target-value]', '1.2');
    await page.fill('input[name=umax]', '0.4');
    await page.fill('input[name=rate]', '500');
    await page.click('[data-testid=design]');
    await page.waitForSelector('[data-testid=stages]', { timeout: 60_000 });
    const rows = await page.locator('[data-testid=stages] tbody tr').count();
    expect(rows).toBe(1);
    await page.waitForSelector('[data-testid=cautions] li');
    await e.shot('04-controller');
    expect(e.consoleErrors.join("\n")).toBe("");
  }, 90_000);

  it('saves the project, starts a new one and reopens the saved file', async () => {
    const { page } = e;
    const file = join(mkdtempSync(join(tmpdir(), 'ergostat-e2e-')), 'bench-rig.ergostat');
    page.on('dialog', (d) => void d.accept());
    await page.fill('input[name=project-path]', file);
    await page.click('[data-testid=save-project-as]');
    await page.waitForSelector(`[data-testid=project-bar] >> text="${file}"`);
    expect(existsSync(file)).toBe(true);
    await page.click('text=New');
    await page.click('[data-step=recordings]');
    expect(await page.locator('[data-recording]').count()).toBe(0);
    await page.fill('input[name=project-path]', file);
    await page.click('[data-testid=open-project]');
    await page.waitForSelector('[data-recording="larkspur-pendulum"]');
    await page.waitForSelector('[data-recording="bench-swing"]');
    await e.shot('05-reopened');
    expect(e.consoleErrors.join("\n")).toBe("");
  }, 60_000);
});
