// C99 text pieces: double literals that read back to the same IEEE 754 double (17 significant
// digits, the printf "%.17g" precision, enough for any double to round-trip: IEEE 754-2008 §5.12.2),
// and comment text that cannot end its comment or splice lines, whatever the input.

/** A C double literal for x with 17 significant digits; throws for NaN and infinities. */
export function cDouble(x: number, what = 'value'): string {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw new RangeError(`${what}: cannot write the non-finite number ${String(x)} as a C constant`);
  if (Object.is(x, -0)) return '-0.0';
  const s = x.toPrecision(17);
  return /[.e]/.test(s) ? s : `${s}.0`;
}

/** The literal wrapped in parentheses when negative, so it can stand as an operand. */
export function cOperand(x: number, what = 'value'): string {
  const s = cDouble(x, what);
  return s.startsWith('-') ? `(${s})` : s;
}

/**
 * Text safe inside a C block comment: printable ASCII only (anything else becomes '?'),
 * no comment delimiters, no trigraphs (C99 5.2.1.1), no backslashes (line splicing).
 */
export function commentText(s: string): string {
  let out = '';
  for (const ch of String(s)) {
    const c = ch.codePointAt(0) as number;
    out += c >= 0x20 && c < 0x7f ? ch : ch === '\t' ? ' ' : '?';
  }
  out = out.replace(/\\/g, '/');
  while (/\*\/|\/\*|\?\?/.test(out)) out = out.replace(/\*\//g, '* /').replace(/\/\*/g, '/ *').replace(/\?\?/g, '? ?');
  return out;
}

/** Splits text into comment lines of at most `width` characters (at spaces where possible), each prefixed. */
export function commentLines(text: string, prefix = ' * ', width = 96): string[] {
  const words = commentText(text).split(/ +/).filter((w) => w.length > 0);
  const lines: string[] = [];
  let cur = '';
  for (const w of words) {
    if (cur.length > 0 && cur.length + 1 + w.length > width) { lines.push(prefix + cur); cur = ''; }
    cur = cur.length > 0 ? `${cur} ${w}` : w;
    while (cur.length > width) { lines.push(prefix + cur.slice(0, width)); cur = cur.slice(width); }
  }
  if (cur.length > 0 || lines.length === 0) lines.push(prefix + cur);
  return lines.map((l) => l.trimEnd());
}
