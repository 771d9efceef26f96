// The one error type of the formula language: where (1-based column), what was expected, what was found.

export class FormulaError extends Error {
  override name = 'FormulaError';
  /** 1-based column of the offending character in the source (0 when the tree did not come from source). */
  readonly column: number;
  /** What the parser or compiler expected at that column, e.g. `")" after arguments of max`. */
  readonly expected: string;
  /** What it found there, e.g. `end of formula`, `name "x"`. */
  readonly found: string;

  constructor(column: number, expected: string, found: string) {
    super(`${column > 0 ? `column ${column}: ` : ''}expected ${expected}, found ${found}`);
    this.column = column;
    this.expected = expected;
    this.found = found;
  }
}
