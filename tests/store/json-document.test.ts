import { describe, expect, it } from 'vitest';
import { checkJsonValue, parseJsonDocument, toJsonText } from '../../src-main/store/json-document.ts';

describe('JSON documents', () => {
  it('accepts plain JSON data and gives back what JSON.parse gives', () => {
    const text = '{"a":[1,-2.5e-300,"x",null,true],"b":{"c":{}}}';
    expect(parseJsonDocument(text, 'object', 64, 'doc')).toEqual(JSON.parse(text));
    expect(toJsonText({ a: [1, 'x'] }, 'object', 64, 1000, 'doc')).toBe('{"a":[1,"x"]}');
  });

  it('refuses the wrong top-level shape, bad JSON, deep nesting and __proto__ keys, naming the spot', () => {
    expect(() => parseJsonDocument('[]', 'object', 64, 'model m')).toThrow('model m: expected a JSON object, got an array');
    expect(() => parseJsonDocument('{}', 'array', 64, 'w')).toThrow('w: expected a JSON array, got an object of type Object');
    expect(() => parseJsonDocument('{"a":', 'object', 64, 'doc')).toThrow(/^doc: not valid JSON/);
    expect(() => parseJsonDocument('{"a":[[[1]]]}', 'object', 3, 'doc')).toThrow('doc.a[0][0][0]: nested deeper than 3 levels');
    expect(() => parseJsonDocument('{"x":{"__proto__":1}}', 'object', 64, 'doc')).toThrow('doc.x: the key "__proto__" is not allowed');
  });

  it('refuses values JSON cannot carry, and documents over the byte limit', () => {
    // {"a":"x...x"} with 100 x: 8 bytes of punctuation and key + 100 = 108 bytes.
    expect(() => checkJsonValue({ a: Infinity }, 'object', 64, 'd')).toThrow('d.a: Infinity cannot be stored as JSON');
    expect(() => checkJsonValue({ a: new Date(0) }, 'object', 64, 'd')).toThrow('d.a: an object of type Date is not JSON data');
    expect(() => checkJsonValue({ a: undefined }, 'object', 64, 'd')).toThrow('d.a: a undefined is not JSON data');
    expect(() => toJsonText({ a: 'x'.repeat(100) }, 'object', 64, 50, 'd')).toThrow('d: 108 bytes of JSON, over the limit of 50');
  });
});
