// A growable Float64Array kept as a list of blocks, so growing never copies what is already
// stored and never holds two large buffers at once; toArray() copies into one exact-size array
// and releases the blocks as it goes (peak = data + one block, not 2-3x the data as with doubling
// and a final trim). Blocks start small (short runs stay small) and double up to 512 KiB.
// Several stores may share a BlockPool: full-size blocks released by toArray() are reused by the
// next pushes instead of fresh memory (fresh pages cost a page fault each, which on a virtual
// machine is a large part of an import's time).

const FIRST = 1 << 10;
const BLOCK = 1 << 16; // 65 536 doubles = 512 KiB

const EMPTY = new Float64Array(0);

/** Spare full-size blocks shared by the stores of one import; dropped with it. */
export class BlockPool {
  readonly free: Float64Array[] = [];
  constructor(readonly maxBlocks = 64) {}
  take(): Float64Array | undefined {
    return this.free.pop();
  }
  give(b: Float64Array): void {
    if (b.length === BLOCK && this.free.length < this.maxBlocks) this.free.push(b);
  }
}

export class GrowableF64 {
  private blocks: Float64Array[] = [];
  private cur: Float64Array = EMPTY;
  private fill = 0;
  private done = 0;

  constructor(private readonly pool?: BlockPool) {}

  get length(): number {
    return this.done + this.fill;
  }

  push(x: number): void {
    if (this.fill === this.cur.length) this.grow();
    this.cur[this.fill++] = x;
  }

  /** Pushes src[i] (no double crosses the call, so nothing is boxed if the JIT does not inline this). */
  pushFrom(src: Float64Array, i: number): void {
    if (this.fill === this.cur.length) this.grow();
    this.cur[this.fill++] = src[i];
  }

  private grow(): void {
    if (this.cur.length > 0) {
      this.blocks.push(this.cur);
      this.done += this.cur.length;
    }
    const size = Math.min(BLOCK, Math.max(FIRST, 2 * this.cur.length));
    this.cur = (size === BLOCK ? this.pool?.take() : undefined) ?? new Float64Array(size);
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
      this.pool?.give(b);
    }
    out.set(this.cur.subarray(0, this.fill), at);
    this.pool?.give(this.cur);
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
