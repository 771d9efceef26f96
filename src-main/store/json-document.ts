// JSON documents in a project file are data from a possibly untrusted source. They are parsed
// with JSON.parse only (never evaluated) and their shape is checked at the door: size, nesting
// depth, the expected top-level type, and no "__proto__" keys (harmless to JSON.parse itself,
// but a trap for any later Object.assign-style merge). Contents belong to the engines.

export type JsonValue = null | boolean | number | string | JsonValue[] | { [key: string]: JsonValue };
export type JsonObject = { [key: string]: JsonValue };

export type JsonShape = 'object' | 'array';

/** Throws an Error with a message naming the offending spot when `value` is not plain JSON data. */
export function checkJsonValue(value: unknown, shape: JsonShape, maxDepth: number, where: string): void {
  if (shape === 'object' && !isPlainObject(value)) throw new Error(`${where}: expected a JSON object, got ${describe(value)}`);
  if (shape === 'array' && !Array.isArray(value)) throw new Error(`${where}: expected a JSON array, got ${describe(value)}`);
  walk(value, 0, maxDepth, where);
}

function walk(v: unknown, depth: number, maxDepth: number, where: string): void {
  if (depth > maxDepth) throw new Error(`${where}: nested deeper than ${maxDepth} levels`);
  if (v === null || typeof v === 'boolean' || typeof v === 'string') return;
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) throw new Error(`${where}: ${v} cannot be stored as JSON`);
    return;
  }
  if (Array.isArray(v)) {
    for (let i = 0; i < v.length; i++) walk(v[i], depth + 1, maxDepth, `${where}[${i}]`);
    return;
  }
  if (isPlainObject(v)) {
    for (const key of Object.keys(v)) {
      if (key === '__proto__') throw new Error(`${where}: the key "__proto__" is not allowed`);
      walk(v[key], depth + 1, maxDepth, `${where}.${key}`);
    }
    return;
  }
  throw new Error(`${where}: ${describe(v)} is not JSON data`);
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  if (v === null || typeof v !== 'object' || Array.isArray(v)) return false;
  const proto = Object.getPrototypeOf(v);
  return proto === Object.prototype || proto === null;
}

function describe(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'an array';
  if (typeof v === 'object') return `an object of type ${(v as object).constructor?.name ?? 'unknown'}`;
  return `a ${typeof v}`;
}

/** JSON text of a checked value (the form written to the file). */
export function toJsonText(value: unknown, shape: JsonShape, maxDepth: number, maxBytes: number, where: string): string {
  checkJsonValue(value, shape, maxDepth, where);
  const text = JSON.stringify(value);
  const bytes = Buffer.byteLength(text, 'utf8');
  if (bytes > maxBytes) throw new Error(`${where}: ${bytes} bytes of JSON, over the limit of ${maxBytes}`);
  return text;
}

/** Parses JSON text from a file and checks its shape; errors name `where`. */
export function parseJsonDocument(text: string, shape: JsonShape, maxDepth: number, where: string): JsonValue {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    throw new Error(`${where}: not valid JSON (${e instanceof Error ? e.message : String(e)})`);
  }
  checkJsonValue(value, shape, maxDepth, where);
  return value as JsonValue;
}

/** A deep copy of checked JSON data (so the store never shares objects with its callers). */
export function cloneJson<T extends JsonValue>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}
