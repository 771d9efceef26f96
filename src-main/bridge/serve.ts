// `npm run browser`: the app in a local browser, without Electron. Serves the built renderer
// (dist/, from `vite build`) and the operation table on 127.0.0.1 only, prints the address and
// runs until interrupted. Paths typed into the app are paths on this machine.
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { startBridge } from './server.ts';
import { createHandlers } from '../api/handlers.ts';

const dist = resolve(import.meta.dirname, '../../dist');
if (!existsSync(resolve(dist, 'index.html'))) {
  console.error(`ergostat browser mode: ${dist}/index.html is missing; run "npx vite build" first (npm run browser does)`);
  process.exit(1);
}
const port = Number(process.env.ERGOSTAT_PORT ?? 0);
const bridge = await startBridge({ staticDir: dist, handlers: createHandlers(), port: Number.isInteger(port) && port >= 0 ? port : 0 });
console.log(`Ergostat is running at ${bridge.url} (this machine only). Press Ctrl+C to stop.`);
const stop = () => void bridge.close().then(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
