// HTML text helpers for the report: every piece of text from a file goes through escapeHtml.

export function escapeHtml(s: unknown): string {
  return String(s).replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}

/** A number for people: up to `digits` significant digits, no trailing zeros; '-' for null/undefined. */
export function fmt(x: number | null | undefined, digits = 4): string {
  if (x === null || x === undefined) return '\u2013';
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e6) return String(Number(x.toPrecision(digits)));
  return x.toExponential(digits - 1).replace(/\.?0+e/, 'e');
}

/** A table from rows of already-escaped cells; header cells are escaped here. */
export function table(head: string[], rows: string[][], cls = ''): string {
  return `<table${cls ? ` class="${cls}"` : ''}><thead><tr>${head.map((h) => `<th>${escapeHtml(h)}</th>`).join('')}</tr></thead>`
    + `<tbody>${rows.map((r) => `<tr>${r.map((c) => `<td>${c}</td>`).join('')}</tr>`).join('')}</tbody></table>`;
}
