// Worker-thread entry for engine jobs: installs the tsx loader in this thread, then loads the
// TypeScript job runner. Plain .mjs so Node can start it without a loader.
import { register } from 'tsx/esm/api';

register();
await import(new URL('./job-worker.ts', import.meta.url).href);
