// Byte-level helpers shared by the CSV header reader, the row parser and the number parser.
// Contract for every scanner here: the bytes from the start index contain a '\n' before the
// buffer ends (the row parser only ever hands over whole lines), so scans stop without a bound check.

export const NL = 10;
export const CR = 13;
export const QUOTE = 34;
export const SPACE = 32;
export const TAB = 9;

/**
 * Index of the byte ending the field that starts at p: the delimiter, the '\n', or the '\r' of a
 * "\r\n". Double quotes toggle a quoted stretch in which delimiters do not count ("" is an escaped quote).
 * A quoted stretch never crosses a line end.
 */
export function fieldEnd(b: Uint8Array, p: number, delim: number): number {
  let i = p;
  let quoted = false;
  for (;;) {
    const c = b[i];
    if (c === NL) return i;
    if (c === QUOTE) quoted = !quoted;
    else if (!quoted && (c === delim || (c === CR && b[i + 1] === NL))) return i;
    i++;
  }
}

const utf8 = new TextDecoder('utf-8');

/** Bytes [s, e) as text (UTF-8; the common all-ASCII case without a decoder). */
export function decodeBytes(b: Uint8Array, s: number, e: number): string {
  if (e - s <= 64) {
    let ascii = true;
    for (let i = s; i < e; i++) if (b[i] > 127) { ascii = false; break; }
    if (ascii) return String.fromCharCode.apply(null, b.subarray(s, e) as unknown as number[]);
  }
  return utf8.decode(b.subarray(s, e));
}

/** Trims a field's text and removes one pair of enclosing double quotes (undoing "" escapes). */
export function unquoteField(raw: string): string {
  const t = raw.trim();
  if (t.length >= 2 && t.charCodeAt(0) === QUOTE && t.charCodeAt(t.length - 1) === QUOTE) return t.slice(1, -1).replace(/""/g, '"').trim();
  return t;
}
