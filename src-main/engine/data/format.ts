// Number formatting for messages: a few significant digits, no trailing zeros, no exponent for
// ordinary magnitudes.

export function fmt(x: number, digits = 6): string {
  return String(Number(x.toPrecision(digits)));
}

export function plural(n: number, word: string, many = `${word}s`): string {
  return `${n} ${n === 1 ? word : many}`;
}
