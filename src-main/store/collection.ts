// A named, ordered collection of one kind of entry. Entries are checked and deep-copied on the
// way in and copied on the way out, so nothing the store holds is shared with its callers.

export class Collection<T extends { name: string }> {
  readonly #items: T[] = [];
  readonly #what: string;
  readonly #max: number;
  readonly #check: (v: unknown, where: string) => T;
  readonly #copy: (v: T) => T;

  constructor(what: string, max: number, check: (v: unknown, where: string) => T, copy: (v: T) => T) {
    this.#what = what;
    this.#max = max;
    this.#check = check;
    this.#copy = copy;
  }

  get size(): number {
    return this.#items.length;
  }

  /** Names in order. */
  names(): string[] {
    return this.#items.map((e) => e.name);
  }

  has(name: string): boolean {
    return this.#items.some((e) => e.name === name);
  }

  /** A copy of the entry, or undefined. */
  get(name: string): T | undefined {
    const e = this.#items.find((x) => x.name === name);
    return e === undefined ? undefined : this.#copy(e);
  }

  /** Copies of all entries, in order. */
  list(): T[] {
    return this.#items.map((e) => this.#copy(e));
  }

  /** Adds an entry, or replaces the one with the same name in place. Throws TypeError naming the bad field. */
  put(entry: T): void {
    let checked: T;
    try {
      checked = this.#check(entry, this.#what);
    } catch (e) {
      throw new TypeError(e instanceof Error ? e.message : String(e));
    }
    const i = this.#items.findIndex((x) => x.name === checked.name);
    if (i >= 0) {
      this.#items[i] = checked;
      return;
    }
    if (this.#items.length >= this.#max) throw new TypeError(`${this.#what}: the project already holds ${this.#max}, the limit`);
    this.#items.push(checked);
  }

  remove(name: string): boolean {
    const i = this.#items.findIndex((x) => x.name === name);
    if (i < 0) return false;
    this.#items.splice(i, 1);
    return true;
  }

  /**
   * The stored entry itself, not a copy: for summaries and plots of large recordings, where a
   * copy would cost too much. Treat it as read-only; a change would alter the project silently.
   */
  peek(name: string): Readonly<T> | undefined {
    return this.#items.find((x) => x.name === name);
  }

  /** All stored entries themselves, in order (read-only, as for peek). */
  peekAll(): readonly Readonly<T>[] {
    return this.#items;
  }

  /** Takes entries already checked and owned (from a file just read). */
  adopt(entries: T[]): void {
    this.#items.splice(0, this.#items.length, ...entries);
  }
}
