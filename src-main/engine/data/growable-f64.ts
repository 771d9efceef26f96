// A growable Float64Array kept as a list of blocks, so growing never copies what is already
// stored and never holds two large buffers at once; toArray() copies into one exact-size array
// and releases the blocks as it goes (peak = data + one block, not 2-3x the data as with doubling
// and a final trim). Blocks start small (short runs stay small) and double up to 512 KiB.

const FIRST = 1 << 10;
const BLOCK = 1 << 16; // 65 536 doubles = 512 KiB

const EMPTY = new Float64Array(0);

export class GrowableF64 {
  private blocks: Float64Array[] = [];
  private cur: Float64Array = EMPTY;
  private fill = 0;
  private done = 0;

  get length(): number {
    return this.done + this.fill;
  }

  push(x: number): void {
    if (this.fill === this.cur.length) this.grow();
    this.cur[this.fill++] = x;
  }

  private grow(): void {
    if (this.cur.length > 0) {
      this.blocks.push(this.cur);
      this.done += this.cur.length;
    }
    this.cur = new Float64Array(Math.min(BLOCK, Math.max(FIRST, 2 * this.cur.length)));
    this.fill = 0;
  }

  /** The last value pushed (NaN when empty). */
  last(): number {
    if (this.fill > 0) return this.cur[this.fill - 1];
    const n = this.blocks.length;
    return n > 0 ? this.blocks[n - 1][this.blocks[n - 1].length - 1] : NaN;
  }

  /** All values in one exact-size array; the store is left empty. */
  toArray(): Float64Array {
    const out = new Float64Array(this.length);
    let at = 0;
    const blocks = this.blocks as (Float64Array | undefined)[];
    for (let k = 0; k < blocks.length; k++) {
      const b = blocks[k]!;
      out.set(b, at);
      at += b.length;
      blocks[k] = undefined; // release as we go
    }
    out.set(this.cur.subarray(0, this.fill), at);
    this.clear();
    return out;
  }

  clear(): void {
    this.blocks = [];
    this.cur = EMPTY;
    this.fill = 0;
    this.done = 0;
  }
}
