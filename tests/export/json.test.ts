// Pretty JSON: parses back to an equal document, two-space indent, non-finite values listed by path.
import { describe, expect, it } from 'vitest';
import { prettyJson } from '../../src-main/export/json.ts';
import { pendulumDesign } from './fixtures.ts';

describe('prettyJson', () => {
  it('writes the design so that it parses back equal (JSON.parse as the independent reader)', () => {
    const d = pendulumDesign();
    const r = prettyJson(d, 'design');
    expect(JSON.parse(r.text)).toEqual(d);
    expect(r.text).toMatch(/^\{\n {2}"format": "ergostat-controller-design",\n/);
    expect(r.text.endsWith('}\n')).toBe(true);
    expect(r.nonFinite).toEqual([]);
  });

  it('lists values JSON cannot hold, by path, and writes typed arrays as arrays', () => {
    const r = prettyJson({ a: { b: [1, NaN] }, c: Infinity, d: new Float64Array([1, 2]) }, 'model');
    expect(r.nonFinite).toEqual(['a.b[1] (NaN)', 'c (Infinity)']);
    expect(JSON.parse(r.text)).toEqual({ a: { b: [1, null] }, c: null, d: [1, 2] });
  });

  it('refuses cycles, naming the path', () => {
    const x: Record<string, unknown> = { a: {} };
    (x.a as Record<string, unknown>).self = x;
    expect(() => prettyJson(x, 'model')).toThrow(/model: a\.self refers back to itself/);
  });
});
