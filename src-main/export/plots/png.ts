// SVG to PNG with resvg (@resvg/resvg-js): system fonts, DejaVu Sans where present (the plots
// ask for DejaVu Sans first, then the system's sans-serif).
import { Resvg } from '@resvg/resvg-js';

export function svgToPng(svg: string, scale = 2): Buffer {
  if (typeof svg !== 'string' || !svg.includes('<svg')) throw new TypeError('svg: expected an SVG document');
  if (!(scale > 0 && scale <= 8)) throw new RangeError(`scale: expected 0 < scale <= 8, got ${scale}`);
  const r = new Resvg(svg, {
    font: { loadSystemFonts: true, defaultFontFamily: 'DejaVu Sans', sansSerifFamily: 'DejaVu Sans' },
    fitTo: { mode: 'zoom', value: scale },
    background: '#ffffff',
  });
  return r.render().asPng();
}
