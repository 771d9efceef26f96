// Worker-thread entry: installs the tsx loader in this thread, then loads the TypeScript worker.
// Plain .mjs so that Node can start it without a loader (under vitest and under the CLI alike).
import { register } from 'tsx/esm/api';

register();
await import(new URL('./worker.ts', import.meta.url).href);
