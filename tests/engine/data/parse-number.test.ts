import { describe, expect, it } from 'vitest';
import { NL } from '../../../src-main/engine/data/csv-bytes.ts';
import { NUM_INVALID, NUM_MISSING, NUM_OK, numberScan, parseNumberText, scanNumber } from '../../../src-main/engine/data/parse-number.ts';

// The reference for every value is JavaScript's own Number(), which ECMA-262 (§7.1.4.1.1,
// StringToNumber) requires to round correctly; our fast path (Clinger 1990) must match it bit for bit.
function sameBits(a: number, b: number): boolean {
  return Object.is(a, b);
}

/** A small deterministic generator (Park & Miller minimal standard, CACM 31 (1988) 1192). */
function lcg(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

describe('parseNumberText', () => {
  it('matches Number() bit for bit on plain decimals, exponents and full-precision values', () => {
    const rnd = lcg(12345);
    const texts: string[] = [];
    for (let i = 0; i < 8000; i++) {
      const x = (rnd() - 0.5) * 10 ** Math.floor(rnd() * 16 - 8);
      texts.push(String(x), x.toFixed(3), x.toFixed(9), x.toPrecision(1 + (i % 17)), x.toExponential(i % 15));
    }
    texts.push('0', '-0', '0.0', '-0.000', '1e22', '1e23', '9007199254740991', '9007199254740993', '123456789012345678901234567890',
      '4.9e-324', '2.2250738585072014e-308', '1.7976931348623157e308', '0.1', '.5', '5.', '+3.25', '1E5', '1e+05', '1e-05', '000123.4500');
    for (const s of texts) {
      const v = parseNumberText(s);
      if (!sameBits(v, Number(s))) throw new Error(`"${s}": got ${v}, Number() gives ${Number(s)}`);
    }
    expect(texts.length).toBeGreaterThan(40000);
  });

  it('allows blanks and one pair of quotes around a number', () => {
    expect(parseNumberText('  -1.25 ')).toBe(-1.25);
    expect(parseNumberText('"2.5"')).toBe(2.5);
  });

  it('rejects what is not a finite decimal number, including what Number() would accept', () => {
    for (const s of ['NaN', 'Infinity', '-Infinity', '0x10', '0b11', '1.2.3', '1e', 'e5', '+-1', '--1', '1,5', '1e999', 'abc', '1 2', '.', '-']) {
      expect(Number.isNaN(parseNumberText(s)), s).toBe(true);
    }
  });

  it('reports an empty field as missing and stops at the delimiter or the line end', () => {
    const out = numberScan();
    const b = new TextEncoder().encode('3.5;;x\r\n');
    expect(scanNumber(b, 0, 59, out)).toBe(NUM_OK);
    expect(out.value[0]).toBe(3.5);
    expect([out.status, out.end]).toEqual([NUM_OK, 3]);
    scanNumber(b, 4, 59, out);
    expect([out.status, out.end]).toEqual([NUM_MISSING, 4]);
    scanNumber(b, 5, 59, out);
    expect([out.status, out.end, out.text]).toEqual([NUM_INVALID, 6, 'x']);
    const c = new TextEncoder().encode('7e-3\n');
    scanNumber(c, 0, NL, out);
    expect(out.value[0]).toBe(0.007);
  });
});
