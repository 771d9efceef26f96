// Run-time validation of untrusted arguments: each failure names the path and what was expected.
import { describe, expect, it } from 'vitest';
import * as v from '../../src-main/api/validate.ts';

describe('validators', () => {
  const shape = v.object({ name: v.string({ max: 5 }), n: v.number({ integer: true, min: 0 }), tags: v.optional(v.array(v.literal('a', 'b'))) });
  it('accepts a valid object and drops nothing', () => {
    expect(shape.parse({ name: 'ok', n: 3, tags: ['a'] }, 'x')).toEqual({ name: 'ok', n: 3, tags: ['a'] });
  });
  it('names the bad field and what was expected', () => {
    expect(() => shape.parse({ name: 'toolong', n: 3 }, 'args')).toThrow('args.name: expected a string of 0..5 characters, found "toolong"');
    expect(() => shape.parse({ name: 'ok', n: 1.5 }, 'args')).toThrow('args.n: expected an integer in [0, Infinity], found 1.5');
    expect(() => shape.parse({ name: 'ok', n: 1, tags: ['c'] }, 'args')).toThrow('args.tags[0]: expected one of "a", "b", found "c"');
    expect(() => shape.parse({ name: 'ok', n: 1, more: 1 }, 'args')).toThrow('args.more: expected no such field');
    expect(() => shape.parse(null, 'args')).toThrow('args: expected an object with fields name, n, tags, found null');
  });
  it('refuses non-finite numbers and class instances', () => {
    expect(() => v.number().parse(NaN, 'p')).toThrow('p: expected a finite number');
    expect(() => v.object({}).parse(new Date(), 'p')).toThrow('a plain object');
  });
  it('refuses prototype-polluting record keys', () => {
    const rec = v.record(v.number());
    expect(rec.parse({ a: 1, b_2: 2 }, 'params')).toEqual({ a: 1, b_2: 2 });
    expect(() => rec.parse(JSON.parse('{"__proto__": 1}'), 'params')).toThrow('params.__proto__');
  });
  it('bounds the depth of JSON documents', () => {
    let deep: unknown = 1;
    for (let i = 0; i < 40; i++) deep = [deep];
    expect(() => v.json({ maxDepth: 32 }).parse(deep, 'doc')).toThrow('expected a JSON value (depth <= 32)');
  });
});
