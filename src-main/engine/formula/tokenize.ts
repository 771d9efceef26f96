// Lexer of the formula language: numbers, names, the operators + - * / ^, parentheses and
// commas. Anything else (quotes, brackets, dots outside numbers, semicolons...) is an error at
// its column. Hand-written scanner over char codes; no regular expressions on untrusted input.
import { FormulaError } from './error.ts';

export type TokenType = 'num' | 'name' | 'op' | 'end';

export interface Token {
  type: TokenType;
  /** The source text of the token ('' for end). */
  text: string;
  /** Numeric value (num tokens only). */
  value: number;
  /** 1-based column of the first character. */
  column: number;
}

/** Longest source accepted, in characters (a guard against pathological inputs). */
export const MAX_FORMULA_LENGTH = 10_000;

const isDigit = (c: number): boolean => c >= 48 && c <= 57;
const isNameStart = (c: number): boolean => (c >= 65 && c <= 90) || (c >= 97 && c <= 122) || c === 95;
const isSpace = (c: number): boolean => c === 32 || c === 9 || c === 10 || c === 13;

/** How an error message shows the token or character found at a column. */
export function describeToken(t: Token): string {
  switch (t.type) {
    case 'end': return 'end of formula';
    case 'num': return `number ${JSON.stringify(t.text)}`;
    case 'name': return `name ${JSON.stringify(t.text)}`;
    default: return JSON.stringify(t.text);
  }
}

function describeChar(src: string, i: number): string {
  return i >= src.length ? 'end of formula' : `character ${JSON.stringify(src[i])}`;
}

export function tokenize(src: string): Token[] {
  if (src.length > MAX_FORMULA_LENGTH) {
    throw new FormulaError(MAX_FORMULA_LENGTH + 1, `a formula of at most ${MAX_FORMULA_LENGTH} characters`, 'a longer formula');
  }
  const out: Token[] = [];
  const n = src.length;
  let i = 0;
  while (i < n) {
    const c = src.charCodeAt(i);
    if (isSpace(c)) { i++; continue; }
    const start = i;
    if (isDigit(c) || (c === 46 && i + 1 < n && isDigit(src.charCodeAt(i + 1)))) {
      while (i < n && isDigit(src.charCodeAt(i))) i++;
      if (i < n && src.charCodeAt(i) === 46) {
        i++;
        while (i < n && isDigit(src.charCodeAt(i))) i++;
      }
      if (i < n && (src.charCodeAt(i) === 101 || src.charCodeAt(i) === 69)) {
        i++;
        if (i < n && (src.charCodeAt(i) === 43 || src.charCodeAt(i) === 45)) i++;
        if (!(i < n && isDigit(src.charCodeAt(i)))) {
          throw new FormulaError(i + 1, `digits in the exponent of number ${JSON.stringify(src.slice(start, i))}`, describeChar(src, i));
        }
        while (i < n && isDigit(src.charCodeAt(i))) i++;
      }
      const text = src.slice(start, i);
      const value = Number(text);
      if (!Number.isFinite(value)) {
        throw new FormulaError(start + 1, 'a number of magnitude below 1.8e308', `number ${JSON.stringify(text)}`);
      }
      out.push({ type: 'num', text, value, column: start + 1 });
      continue;
    }
    if (isNameStart(c)) {
      i++;
      while (i < n) {
        const d = src.charCodeAt(i);
        if (isNameStart(d) || isDigit(d)) i++; else break;
      }
      out.push({ type: 'name', text: src.slice(start, i), value: NaN, column: start + 1 });
      continue;
    }
    const ch = src[i];
    if (ch === '+' || ch === '-' || ch === '*' || ch === '/' || ch === '^' || ch === '(' || ch === ')' || ch === ',') {
      out.push({ type: 'op', text: ch, value: NaN, column: start + 1 });
      i++;
      continue;
    }
    throw new FormulaError(start + 1, 'a number, a name, an operator (+ - * / ^), "(", ")" or ","', describeChar(src, i));
  }
  out.push({ type: 'end', text: '', value: NaN, column: n + 1 });
  return out;
}
