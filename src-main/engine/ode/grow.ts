// A growable Float64Array (amortised doubling) for solver output of unknown length.

export class GrowableF64 {
  private buf: Float64Array;
  length = 0;

  constructor(capacity = 64) {
    this.buf = new Float64Array(Math.max(1, capacity));
  }

  private reserve(extra: number): void {
    if (this.length + extra <= this.buf.length) return;
    let cap = this.buf.length * 2;
    while (cap < this.length + extra) cap *= 2;
    const next = new Float64Array(cap);
    next.set(this.buf.subarray(0, this.length));
    this.buf = next;
  }

  push(x: number): void {
    this.reserve(1);
    this.buf[this.length++] = x;
  }

  /** Appends v[0..count). */
  pushAll(v: Float64Array, count = v.length): void {
    this.reserve(count);
    const buf = this.buf, at = this.length;
    if (count <= 16) for (let i = 0; i < count; i++) buf[at + i] = v[i]; // small rows: a loop beats TypedArray.set
    else buf.set(count === v.length ? v : v.subarray(0, count), at);
    this.length += count;
  }

  /** The live view of the filled part (valid until the next push). */
  view(): Float64Array {
    return this.buf.subarray(0, this.length);
  }

  /** A trimmed copy of the filled part. */
  toArray(): Float64Array {
    return this.buf.slice(0, this.length);
  }
}
