// C literals and comment text (literal.ts): 17 significant digits read back to the same double
// (IEEE 754-2008 §5.12.2: 17 digits suffice for binary64), checked with Number() as the reader;
// comment text can neither close its comment nor splice lines.
import { describe, expect, it } from 'vitest';
import { cDouble, commentText } from '../../../src-main/export/c/index.ts';
import { commentLines } from '../../../src-main/export/c/literal.ts';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';

describe('cDouble', () => {
  it('round-trips doubles, including extremes and -0', () => {
    const rng = new Pcg32(7);
    const xs = [0.1, 1 / 3, Math.PI, 5e-324, 2.2250738585072014e-308, 1.7976931348623157e308, 1e21, 123, -0.1 - 0.2];
    for (let i = 0; i < 2000; i++) xs.push((rng.normal() * 10) ** 7 * (i % 2 ? 1 : -1e-9));
    for (const x of xs) {
      const s = cDouble(x);
      expect(s).toMatch(/^-?\d\.?\d*(e[+-]\d+)?$|^-?\d+\.\d+$/);
      expect(Number(s)).toBe(x);
    }
    expect(cDouble(-0)).toBe('-0.0');
    expect(cDouble(2)).toBe('2.0000000000000000');
  });

  it('refuses NaN and infinities, naming the value', () => {
    expect(() => cDouble(NaN, 'law.Q')).toThrow(/law\.Q: cannot write the non-finite number NaN/);
    expect(() => cDouble(Infinity)).toThrow(/Infinity/);
  });
});

describe('commentText', () => {
  it('breaks comment delimiters, trigraphs and backslashes, and drops control characters', () => {
    const s = commentText('a */ b /* c ??/ d \\ e \u0000 f \u00e9');
    expect(s).not.toMatch(/\*\/|\/\*|\?\?|\\/);
    expect(s).toContain('a * / b / * c ? ?/ d / e ? f ?');
    expect(commentText('**//**')).not.toMatch(/\*\/|\/\*/);
  });

  it('wraps long text into prefixed lines', () => {
    const lines = commentLines('word '.repeat(60), ' * ', 40);
    expect(lines.length).toBeGreaterThan(5);
    for (const l of lines) { expect(l.startsWith(' * ')).toBe(true); expect(l.length).toBeLessThanOrEqual(43); }
  });
});
