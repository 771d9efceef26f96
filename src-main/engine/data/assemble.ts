// Puts the files of one import together into a Recording with its notices and statistics.
import type { Recording } from '../types.ts';
import { baseName } from './data-error.ts';
import type { FileImport, ImportResult } from './types.ts';

/** Names for messages: the last path component, or the whole path where two files share it. */
export function displayNames(files: string[]): string[] {
  const count = new Map<string, number>();
  for (const f of files) count.set(baseName(f), (count.get(baseName(f)) ?? 0) + 1);
  return files.map((f) => (count.get(baseName(f))! > 1 ? f : baseName(f)));
}

export function assembleImport(parts: FileImport[], angle: boolean): ImportResult {
  if (parts.length === 0) throw new RangeError('assembleImport: parts must not be empty');
  const recording: Recording = { coordinate: angle ? 'angle' : 'linear', runs: [] };
  const result: ImportResult = { recording, channels: parts[0].channels, warnings: [], fixes: [], stats: [] };
  const used = new Set<string>();
  for (const part of parts) {
    part.runs.forEach((run, k) => {
      let name = run.name;
      for (let i = 2; used.has(name); i++) name = `${run.name} (${i})`;
      used.add(name);
      recording.runs.push(name === run.name ? run : { ...run, name });
      result.stats.push(name === run.name ? part.stats[k] : { ...part.stats[k], name });
    });
    result.warnings.push(...part.warnings);
    result.fixes.push(...part.fixes);
  }
  return result;
}
