// Plot colours: Ergostat's palette (src-renderer/lib/theme.css), whose series colours are the
// Okabe-Ito colour-blind-safe set (Okabe & Ito, "Color Universal Design", 2002).
export const COLORS = {
  ink: '#22303c',
  inkSoft: '#5b6770',
  rule: '#dedbd2',
  paper: '#ffffff',
  blue: '#0072b2',
  orange: '#e69f00',
  green: '#009e73',
  pink: '#cc79a7',
  vermillion: '#d55e00',
  sky: '#56b4e9',
} as const;

/** Series colours in order of use. */
export const SERIES = [COLORS.blue, COLORS.orange, COLORS.green, COLORS.pink, COLORS.vermillion, COLORS.sky] as const;

export const FONT_FAMILY = 'DejaVu Sans, Noto Sans, Segoe UI, sans-serif';
