// A growable Float64Array kept as a list of fixed-size blocks, so growing never copies what is
// already stored and never holds two large buffers at once; toArray() copies into one exact-size
// array and releases the blocks block by block (peak = data + one block, not 2-3x the data).

const BLOCK = 1 << 16; // 65 536 doubles = 512 KiB per block

export class GrowableF64 {
  private blocks: Float64Array[] = [];
  private cur: Float64Array = new Float64Array(BLOCK);
  private fill = 0;
  private done = 0;

  get length(): number {
    return this.done + this.fill;
  }

  push(x: number): void {
    if (this.fill === BLOCK) {
      this.blocks.push(this.cur);
      this.done += BLOCK;
      this.cur = new Float64Array(BLOCK);
      this.fill = 0;
    }
    this.cur[this.fill++] = x;
  }

  /** The last value pushed (NaN when empty). */
  last(): number {
    if (this.fill > 0) return this.cur[this.fill - 1];
    const n = this.blocks.length;
    return n > 0 ? this.blocks[n - 1][BLOCK - 1] : NaN;
  }

  /** All values in one exact-size array; the store is left empty. */
  toArray(): Float64Array {
    const out = new Float64Array(this.length);
    let at = 0;
    const blocks = this.blocks;
    for (let k = 0; k < blocks.length; k++) {
      out.set(blocks[k], at);
      at += BLOCK;
      (blocks as (Float64Array | undefined)[])[k] = undefined; // release as we go
    }
    out.set(this.cur.subarray(0, this.fill), at);
    this.clear();
    return out;
  }

  clear(): void {
    this.blocks = [];
    this.cur = new Float64Array(BLOCK);
    this.fill = 0;
    this.done = 0;
  }
}
