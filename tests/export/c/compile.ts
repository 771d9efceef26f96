// Test helper: writes exported C files into a fresh temp dir, compiles them with the system C
// compiler (cc -std=c99 -O2 -Wall -Wextra -Werror *.c -lm) and runs the check program.
import { execFileSync, spawnSync } from 'node:child_process';
import { expect } from 'vitest';
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export interface CheckRun { compiled: boolean; compilerOutput: string; status: number | null; stdout: string }

export function compileAndRun(files: { name: string; text: string }[]): CheckRun {
  const dir = mkdtempSync(join(tmpdir(), 'ergostat-c-'));
  try {
    for (const f of files) writeFileSync(join(dir, f.name), f.text);
    const sources = readdirSync(dir).filter((f) => f.endsWith('.c'));
    let compilerOutput = '';
    try {
      compilerOutput = execFileSync('cc', ['-std=c99', '-O2', '-Wall', '-Wextra', '-Werror', ...sources, '-lm', '-o', 'check'], { cwd: dir, encoding: 'utf8', stdio: 'pipe' });
    } catch (e) {
      const err = e as { stderr?: string; stdout?: string };
      return { compiled: false, compilerOutput: `${err.stdout ?? ''}${err.stderr ?? ''}`, status: null, stdout: '' };
    }
    const r = spawnSync(join(dir, 'check'), [], { cwd: dir, encoding: 'utf8' });
    return { compiled: true, compilerOutput, status: r.status, stdout: r.stdout };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The worst relative errors printed by the check program. */
export function worstErrors(stdout: string): { u: number; H: number } {
  const m = /worst relative error: u ([^ ]+) .*H ([^ ]+) /.exec(stdout);
  return m ? { u: Number(m[1]), H: Number(m[2]) } : { u: NaN, H: NaN };
}

/** The files with one pattern replaced in one file (the pattern must occur). */
export function perturb(files: { name: string; text: string }[], file: string, pattern: RegExp, replace: string) {
  return files.map((f) => {
    if (f.name !== file) return f;
    expect(pattern.test(f.text)).toBe(true);
    return { name: f.name, text: f.text.replace(pattern, replace) };
  });
}
