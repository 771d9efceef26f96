// The recent-projects list behind File > Open Recent (common practice: newest first, no
// duplicates, a fixed length; a damaged file never stops the app).
import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadRecent, MAX_RECENT, pushRecent, saveRecent } from '../../electron/recent.ts';

describe('recent projects', () => {
  it('keeps the newest first without duplicates and at most MAX_RECENT', () => {
    let list: string[] = [];
    for (let i = 0; i < 12; i++) list = pushRecent(list, `/p/${i}.ergostat`);
    expect(list).toHaveLength(MAX_RECENT);
    expect(list[0]).toBe('/p/11.ergostat');
    list = pushRecent(list, '/p/8.ergostat');
    expect(list[0]).toBe('/p/8.ergostat');
    expect(list.filter((p) => p === '/p/8.ergostat')).toHaveLength(1);
  });
  it('round-trips through its file and treats a damaged file as empty', () => {
    const dir = mkdtempSync(join(tmpdir(), 'ergostat-recent-'));
    const file = join(dir, 'recent.json');
    saveRecent(file, ['/a.ergostat', '/b.ergostat']);
    expect(loadRecent(file)).toEqual(['/a.ergostat', '/b.ergostat']);
    writeFileSync(file, '{not json');
    expect(loadRecent(file)).toEqual([]);
    writeFileSync(file, JSON.stringify(['/x.csv', 42, '/ok.ergostat']));
    expect(loadRecent(file)).toEqual(['/ok.ergostat']);
    expect(loadRecent(join(dir, 'missing.json'))).toEqual([]);
  });
});
