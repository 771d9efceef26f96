/// <reference types="vitest/config" />
// Browser-mode build of the renderer into dist/ (served by the test bridge on 127.0.0.1).
import { defineConfig } from 'vite';
import { svelte } from '@sveltejs/vite-plugin-svelte';
import { resolve } from 'node:path';

const root = import.meta.dirname;

export default defineConfig({
  root: resolve(root, 'src-renderer'),
  base: './',
  plugins: [svelte({ configFile: resolve(root, 'svelte.config.js') })],
  build: { outDir: resolve(root, 'dist'), emptyOutDir: true },
});
