// The model and the design as pretty JSON (two-space indent, keys in document order, newline at
// the end). Both are already JSON documents; this only guards against values JSON cannot hold:
// NaN and infinities are written as null (as JSON.stringify does) and listed, path by path, so the
// caller can say so instead of losing them silently.

export interface JsonExport { text: string; nonFinite: string[] }

export function prettyJson(doc: unknown, what = 'document'): JsonExport {
  if (doc === undefined) throw new TypeError(`${what}: nothing to write`);
  const nonFinite: string[] = [];
  const seen = new Set<unknown>();
  const walk = (x: unknown, path: string): void => {
    if (typeof x === 'number') { if (!Number.isFinite(x)) nonFinite.push(`${path} (${x})`); return; }
    if (x === null || typeof x !== 'object') return;
    if (seen.has(x)) throw new TypeError(`${what}: ${path} refers back to itself (a cycle cannot be written as JSON)`);
    seen.add(x);
    if (ArrayBuffer.isView(x)) { Array.from(x as unknown as ArrayLike<number>).forEach((v, i) => walk(v, `${path}[${i}]`)); }
    else if (Array.isArray(x)) x.forEach((v, i) => walk(v, `${path}[${i}]`));
    else for (const [k, v] of Object.entries(x)) walk(v, path ? `${path}.${k}` : k);
    seen.delete(x);
  };
  walk(doc, '');
  const text = JSON.stringify(doc, (_k, v: unknown) => (ArrayBuffer.isView(v) && !(v instanceof DataView) ? Array.from(v as unknown as ArrayLike<number>) : v), 2);
  return { text: `${text}\n`, nonFinite };
}
