// SVG text building for the plots: escaped text and attributes, a fixed frame with margins, and
// the document wrapper. Plain strings, no DOM.
import { COLORS, FONT_FAMILY } from './colors.ts';

/** Escapes text for XML element content and attribute values. */
export function escapeXml(s: string): string {
  return String(s).replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string)
    // Characters XML 1.0 does not allow at all (C0 controls except tab, newline, return).
    .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '?');
}

/** A pixel coordinate with two decimals (enough for any screen or print). */
export function px(x: number): string {
  return Number.isFinite(x) ? String(Math.round(x * 100) / 100) : '0';
}

export function attrs(a: Record<string, string | number | undefined>): string {
  let s = '';
  for (const [k, v] of Object.entries(a)) if (v !== undefined) s += ` ${k}="${escapeXml(typeof v === 'number' ? px(v) : v)}"`;
  return s;
}

export function el(tag: string, a: Record<string, string | number | undefined>, body?: string): string {
  return body === undefined ? `<${tag}${attrs(a)}/>` : `<${tag}${attrs(a)}>${body}</${tag}>`;
}

export interface Frame {
  width: number;
  height: number;
  margin: { top: number; right: number; bottom: number; left: number };
}

export interface PlotOptions {
  width?: number;
  height?: number;
  title?: string;
}

export function frameOf(o: PlotOptions): Frame {
  const width = o.width ?? 720, height = o.height ?? 400;
  if (!(width >= 200 && width <= 10000)) throw new RangeError(`width: expected 200 to 10000 px, got ${width}`);
  if (!(height >= 150 && height <= 10000)) throw new RangeError(`height: expected 150 to 10000 px, got ${height}`);
  return { width, height, margin: { top: o.title ? 40 : 16, right: 24, bottom: 52, left: 76 } };
}

let clipCounter = 0;
/** A document-unique id (plots may be inlined several to a page). */
export function uniqueId(prefix: string): string {
  clipCounter = (clipCounter + 1) % 1e9;
  return `${prefix}-${clipCounter}`;
}

/** The standalone SVG document. */
export function svgDocument(f: Frame, body: string, title?: string, description?: string): string {
  const head = `<svg xmlns="http://www.w3.org/2000/svg" width="${f.width}" height="${f.height}" viewBox="0 0 ${f.width} ${f.height}"`
    + ` font-family="${escapeXml(FONT_FAMILY)}" font-size="12" role="img">`;
  const t = title ? `<title>${escapeXml(title)}</title>` : '';
  const d = description ? `<desc>${escapeXml(description)}</desc>` : '';
  const bg = el('rect', { x: 0, y: 0, width: f.width, height: f.height, fill: COLORS.paper });
  const heading = title ? el('text', { x: f.margin.left, y: 24, 'font-size': 15, 'font-weight': 600, fill: COLORS.ink }, escapeXml(title)) : '';
  return `${head}${t}${d}${bg}${heading}${body}</svg>\n`;
}
