// electron-vite: builds the main process, the preload (CommonJS: sandboxed preloads cannot be
// ES modules) and the renderer into out/. Needs no Electron binary.
import { defineConfig } from 'electron-vite';
import { svelte } from '@sveltejs/vite-plugin-svelte';
import { resolve } from 'node:path';

const root = import.meta.dirname;

export default defineConfig({
  main: {
    build: {
      outDir: 'out/main',
      // Engine jobs run in worker threads started from job-worker.js beside the main bundle.
      rollupOptions: { input: { index: resolve(root, 'electron/main.ts'), 'job-worker': resolve(root, 'src-main/jobs/job-worker.ts'), 'trial-worker': resolve(root, 'src-main/trial-workers/worker.ts') } },
    },
  },
  preload: {
    build: {
      outDir: 'out/preload',
      externalizeDeps: false,
      rollupOptions: {
        input: { preload: resolve(root, 'electron/preload.ts') },
        output: { format: 'cjs', entryFileNames: '[name].cjs' },
      },
    },
  },
  renderer: {
    root: resolve(root, 'src-renderer'),
    base: './',
    plugins: [svelte({ configFile: resolve(root, 'svelte.config.js') })],
    build: {
      outDir: resolve(root, 'out/renderer'),
      rollupOptions: { input: resolve(root, 'src-renderer/index.html') },
    },
  },
});
