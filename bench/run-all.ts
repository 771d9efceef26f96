// Runs every bench/*.bench.ts in turn; each prints JSON lines {"name", "value", "unit", ...}.
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const only = process.argv[2];
for (const f of readdirSync(here).filter((n) => n.endsWith('.bench.ts')).sort()) {
  if (only && !f.includes(only)) continue;
  await import(pathToFileURL(join(here, f)).href);
}
