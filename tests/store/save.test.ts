import { spawn } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { basename, join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openProject, ProjectFileError, saveLeftovers } from '../../src-main/store/index.ts';
import { sampleProject, sameBytes, scratchDir } from './helpers.ts';

const { dir, cleanup } = scratchDir('save');
afterAll(cleanup);
const root = resolve(import.meta.dirname, '../..');

interface Child {
  pid: number;
  /** Resolves with the first stdout line starting with `prefix`. */
  line(prefix: string): Promise<string>;
  kill(): Promise<void>;
}

/** Starts tests/store/fixtures/slow-save.ts in its own Node process. */
function startSaver(target: string, mode: 'pause' | 'plain', samples: number, marker: string): Child {
  const child = spawn(process.execPath, ['bin/run-ts.mjs', 'tests/store/fixtures/slow-save.ts', target, mode, String(samples), marker], {
    cwd: root, stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  let err = '';
  const waiters: { prefix: string; done: (l: string) => void }[] = [];
  const exited = new Promise<void>((res) => child.on('exit', () => res()));
  const scan = () => {
    for (const w of [...waiters]) {
      const l = out.split('\n').find((x) => x.startsWith(w.prefix));
      if (l !== undefined) {
        waiters.splice(waiters.indexOf(w), 1);
        w.done(l);
      }
    }
  };
  child.stdout.on('data', (d) => { out += String(d); scan(); });
  child.stderr.on('data', (d) => { err += String(d); });
  return {
    pid: child.pid!,
    line: (prefix) => new Promise((res, rej) => {
      waiters.push({ prefix, done: res });
      scan();
      void exited.then(() => setTimeout(() => rej(new Error(`child exited before "${prefix}": ${out} ${err}`)), 50));
    }),
    kill: async () => {
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
      await exited;
    },
  };
}

/** The marker note a sample project carries (helpers.ts puts it on the first line of 'readme'). */
const markerOf = (path: string): string => openProject(path).notes.get('readme')!.text.split('\n')[0];

/** Files in a folder that a user (or a file dialog filtering *.ergostat) would take for projects. */
const projectFiles = (folder: string): string[] => readdirSync(folder).filter((n) => n.endsWith('.ergostat') && !n.startsWith('.'));

describe('atomic save', () => {
  it('a save killed between writing the temp file and the rename leaves the previous file whole', async () => {
    const folder = join(dir, 'pause');
    mkdirSync(folder);
    const target = join(folder, 'rig.ergostat');
    const previous = sampleProject(500, 'generation 1');
    previous.save(target);
    const before = readFileSync(target);

    const child = startSaver(target, 'pause', 100_000, 'generation 2');
    const ready = await child.line('READY ');
    const temp = ready.slice('READY '.length);
    expect(saveLeftovers(target)).toEqual([]); // the saving process is alive: its temp file is not a leftover
    await child.kill();
    expect(saveLeftovers(target)).toEqual([temp]);

    // The killed save left its temp file; it is hidden and not named *.ergostat.
    expect(existsSync(temp)).toBe(true);
    expect(basename(temp)).toMatch(new RegExp(`^\\.rig\\.ergostat\\.tmp-${child.pid}-[0-9a-f]{12}$`));
    expect(projectFiles(folder)).toEqual(['rig.ergostat']);

    // The previous file is byte for byte what it was, opens, and holds everything.
    expect(readFileSync(target).equals(before)).toBe(true);
    const back = openProject(target);
    expect(markerOf(target)).toBe('generation 1');
    expect(back.recordings.names()).toEqual(['swing-a', 'beam-b']);
    const want = previous.recordings.get('swing-a')!.recording.runs;
    back.recordings.get('swing-a')!.recording.runs.forEach((r, i) => {
      expect(sameBytes(r.t, want[i].t)).toBe(true);
      expect(sameBytes(r.q, want[i].q)).toBe(true);
    });
    expect(back.trials.names()).toEqual(['trial-1']);
    expect(back.models.get('energy-1')).toEqual(previous.models.get('energy-1'));
    rmSync(temp);
  });

  it('kill -9 at several moments during a save: the target always opens, old or new, never half', async () => {
    const folder = join(dir, 'random');
    mkdirSync(folder);
    const target = join(folder, 'rig.ergostat');
    sampleProject(500, 'generation 0').save(target);
    const delays = [0, 60, 400]; // ms after the child starts saving (fixed, so a failure can be replayed)
    const outcomes: string[] = [];
    for (const [k, ms] of delays.entries()) {
      const child = startSaver(target, 'plain', 100_000, `generation ${k + 1}`);
      await child.line('SAVING');
      await new Promise((r) => setTimeout(r, ms));
      await child.kill();
      const leftovers = readdirSync(folder).filter((n) => n.startsWith('.rig.ergostat.tmp-'));
      const marker = markerOf(target); // throws if the target were half-written
      outcomes.push(`${ms} ms: ${marker}${leftovers.length ? ' (temp left behind)' : ''}`);
      expect(projectFiles(folder)).toEqual(['rig.ergostat']);
      for (const n of leftovers) rmSync(join(folder, n));
    }
    console.log(`crash outcomes: ${outcomes.join('; ')}`);
    expect(outcomes).toHaveLength(delays.length);
  });

  it('a save that fails removes its temp file and leaves the old file untouched', () => {
    const folder = join(dir, 'fail');
    mkdirSync(folder);
    const target = join(folder, 'rig.ergostat');
    sampleProject(100, 'old').save(target);
    const before = readFileSync(target);
    let seenTemp = '';
    let err: unknown;
    try {
      sampleProject(100, 'new').save(target, {
        beforeRename: (t) => {
          seenTemp = t;
          throw new Error('disk unplugged');
        },
      });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ProjectFileError);
    expect((err as ProjectFileError).reason).toBe('save failed, the previous file is unchanged: disk unplugged');
    expect(seenTemp).not.toBe('');
    expect(existsSync(seenTemp)).toBe(false);
    expect(readdirSync(folder)).toEqual(['rig.ergostat']);
    expect(readFileSync(target).equals(before)).toBe(true);
    expect(markerOf(target)).toBe('old');
  });

  it('a save into a missing folder fails with the path named and creates nothing', () => {
    const target = join(dir, 'no-such-folder', 'rig.ergostat');
    expect(() => sampleProject(10).save(target)).toThrow(ProjectFileError);
    expect(() => sampleProject(10).save(target)).toThrow(/rig\.ergostat: save failed, the previous file is unchanged: ENOENT/);
    expect(existsSync(join(dir, 'no-such-folder'))).toBe(false);
  });
});

describe('save details', () => {
  it('keeps the permissions of the file it replaces, even a read-only one', () => {
    const folder = join(dir, 'mode');
    mkdirSync(folder);
    const target = join(folder, 'rig.ergostat');
    sampleProject(10, 'first').save(target);
    chmodSync(target, 0o440);
    sampleProject(10, 'second').save(target);
    expect(statSync(target).mode & 0o777).toBe(0o440);
    expect(markerOf(target)).toBe('second');
  });
});
