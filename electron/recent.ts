// The recent-projects list for the File menu on every platform: the last few project paths,
// newest first, kept as JSON in the app's user-data folder. Pure list logic plus a small file
// store, so the list is testable without Electron.
import { readFileSync, writeFileSync } from 'node:fs';

export const MAX_RECENT = 8;

/** Puts path first, drops duplicates and entries beyond MAX_RECENT. */
export function pushRecent(list: readonly string[], path: string): string[] {
  return [path, ...list.filter((p) => p !== path)].slice(0, MAX_RECENT);
}

/** Reads the list; a missing or damaged file is an empty list (it is only a convenience). */
export function loadRecent(file: string): string[] {
  try {
    const data: unknown = JSON.parse(readFileSync(file, 'utf8'));
    if (!Array.isArray(data)) return [];
    return data.filter((p): p is string => typeof p === 'string' && p.endsWith('.ergostat') && p.length < 4096).slice(0, MAX_RECENT);
  } catch {
    return [];
  }
}

export function saveRecent(file: string, list: readonly string[]): void {
  try {
    writeFileSync(file, JSON.stringify(list.slice(0, MAX_RECENT)));
  } catch {
    // Not being able to remember recent files must never stop the app.
  }
}
