// Recordings import throughput and memory on a 10-million-row CSV (t, angle, run): 10 runs of
// 1 M samples at 1 kHz, angles printed with 6 decimals (a typical DAQ export), two of the runs
// rotating over the top so their angle arrives wrapped. The file is written once to the system
// temp folder (streamed) and reused while its size matches the size recorded beside it.
// Prints JSON lines {"name", "value", "unit"}; goals: >= 2 M rows/s, peak RSS < 400 MB.
import { closeSync, existsSync, openSync, readFileSync, readSync, statSync, writeFileSync, writeSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { importRecordings } from '../src-main/recordings/index.ts';

const RUNS = 10;
const PER_RUN = 1_000_000;
const ROWS = RUNS * PER_RUN;
const RATE = 1000;
const VERSION = 1;
const file = join(tmpdir(), `ergostat-import-bench-${ROWS}.csv`);
const meta = `${file}.json`;

function emit(name: string, value: number, unit: string, extra: Record<string, unknown> = {}): void {
  console.log(JSON.stringify({ name, value, unit, ...extra }));
}

function wrap(x: number): number {
  return x - 2 * Math.PI * Math.floor((x + Math.PI) / (2 * Math.PI));
}

function angleAt(run: number, t: number): number {
  const w = 2 * Math.PI * 0.8;
  if (run >= RUNS - 2) return wrap(6 * t * Math.exp(-t / 2000) + 0.2 * Math.sin(w * t)); // rotating
  const a = 0.4 + 0.3 * run;
  return a * Math.exp(-0.002 * w * t) * Math.cos(w * t);
}

function writeFile(): number {
  const fd = openSync(file, 'w');
  let bytes = 0;
  try {
    const head = 't,angle,run\n';
    bytes += writeSync(fd, head);
    const BATCH = 20_000;
    for (let r = 0; r < RUNS; r++) {
      const label = `run${String(r + 1).padStart(2, '0')}`;
      for (let k0 = 0; k0 < PER_RUN; k0 += BATCH) {
        let s = '';
        for (let k = k0; k < k0 + BATCH; k++) {
          const t = k / RATE;
          s += `${t.toFixed(3)},${angleAt(r, t).toFixed(6)},${label}\n`;
        }
        bytes += writeSync(fd, s);
      }
    }
  } finally {
    closeSync(fd);
  }
  writeFileSync(meta, JSON.stringify({ version: VERSION, rows: ROWS, bytes }));
  return bytes;
}

function reusable(): boolean {
  if (!existsSync(file) || !existsSync(meta)) return false;
  try {
    const m = JSON.parse(readFileSync(meta, 'utf8')) as { version: number; rows: number; bytes: number };
    return m.version === VERSION && m.rows === ROWS && statSync(file).size === m.bytes;
  } catch {
    return false;
  }
}

let t0 = performance.now();
const reused = reusable();
if (!reused) writeFile();
const size = statSync(file).size;
emit('import.file', size / 1e6, 'MB', { rows: ROWS, reused, writeSeconds: reused ? 0 : (performance.now() - t0) / 1000 });

// Peak memory: sampled every 5 ms (the import yields at every chunk read) and the kernel's maxRSS.
let peak = process.memoryUsage.rss();
const timer = setInterval(() => { peak = Math.max(peak, process.memoryUsage.rss()); }, 5);
const rssBefore = process.memoryUsage.rss();
t0 = performance.now();
const cpu0 = process.cpuUsage();
const result = await importRecordings([file], { time: 't', position: 'angle', run: 'run', angle: true });
const seconds = (performance.now() - t0) / 1000;
const cpu = process.cpuUsage(cpu0);
const cpuSeconds = (cpu.user + cpu.system) / 1e6;
clearInterval(timer);
peak = Math.max(peak, process.memoryUsage.rss());
const maxRss = process.resourceUsage().maxRSS * 1024; // kilobytes on Linux and macOS
let samples = 0;
for (const r of result.recording.runs) samples += r.t.length;
const rowsPerSecond = ROWS / seconds;
emit('import.rows', samples, 'rows', { runs: result.recording.runs.length, fixes: result.fixes.length, warnings: result.warnings.length });
emit('import.wall', seconds, 's');
emit('import.rowsPerSecond', rowsPerSecond, 'rows/s', { goal: 2e6, met: rowsPerSecond >= 2e6 });
emit('import.throughput', size / 1e6 / seconds, 'MB/s');
// CPU time of this process during the import (user + system, all threads): the figure to compare
// when the machine is shared and wall time includes waiting for a core.
emit('import.cpu', cpuSeconds, 's', { rowsPerCpuSecond: ROWS / cpuSeconds, loadAverage1min: loadavg()[0], cores: availableParallelism() });
emit('import.rssBefore', rssBefore / 2 ** 20, 'MiB');
emit('import.peakRssSampled', peak / 2 ** 20, 'MiB', { goal: 400, met: peak / 2 ** 20 < 400 });
emit('import.maxRss', maxRss / 2 ** 20, 'MiB', { goal: 400, met: maxRss / 2 ** 20 < 400, note: 'process lifetime peak (includes writing the file when it was written now)' });

// Same-process reference: Number() on split strings over the first 1 M lines.
const REF = 1_000_000;
const fd = openSync(file, 'r');
const buf = Buffer.allocUnsafe(Math.min(size, 40 * REF + 64));
const got = readSync(fd, buf, 0, buf.length, 0);
closeSync(fd);
const text = buf.toString('latin1', 0, got);
const lines = text.split('\n', REF + 1).slice(1);
t0 = performance.now();
let check = 0;
let runChanges = 0;
let last = '';
for (let i = 0; i < lines.length; i++) {
  const f = lines[i].split(',');
  check += Number(f[0]) + Number(f[1]);
  if (f[2] !== last) { runChanges++; last = f[2]; }
}
const refSeconds = (performance.now() - t0) / 1000;
const refRate = lines.length / refSeconds;
emit('reference.numberSplit.rowsPerSecond', refRate, 'rows/s', { lines: lines.length, checksum: check, runChanges });
emit('import.vsReference', rowsPerSecond / refRate, 'ratio');
