// Renders assets/icon.svg to the PNG sizes electron-builder uses (build/icon.png, 512 px and
// build/icons/NxN.png for Linux). Run after changing the icon: node scripts/make-icons.mjs
import { Resvg } from '@resvg/resvg-js';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';

const svg = readFileSync(new URL('../assets/icon.svg', import.meta.url), 'utf8');
const render = (size) => new Resvg(svg, { fitTo: { mode: 'width', value: size } }).render().asPng();
mkdirSync(new URL('../build/icons/', import.meta.url), { recursive: true });
writeFileSync(new URL('../build/icon.png', import.meta.url), render(512));
for (const size of [16, 32, 48, 64, 128, 256, 512]) writeFileSync(new URL(`../build/icons/${size}x${size}.png`, import.meta.url), render(size));
console.log('icons written to build/');
