// Seeded pseudo-random numbers for simulated sensors and reproducible tests.
// Generator: PCG32 "XSH RR" (M. E. O'Neill, "PCG: A family of simple fast space-efficient
// statistically good algorithms for random number generation", HMC-CS-2014-0905, 2014):
// a 64-bit linear congruential state with multiplier 6364136223846793005 and an odd stream
// increment, output by xorshift-high then a random rotation to 32 bits.
// Normals: Box–Muller transform (Box & Muller, Ann. Math. Stat. 29 (1958) 610), both values used.
// The 64-bit state is held as two unsigned 32-bit halves so that no BigInt enters the hot loop.

const TWO32 = 4294967296;
// Multiplier 6364136223846793005 = 0x5851F42D_4C957F2D (O'Neill 2014, §6.3).
const MUL_HI = 0x5851f42d;
const MUL_LO = 0x4c957f2d;

/** Splits a non-negative integer seed (number up to 2^53, or bigint up to 2^64) into 32-bit halves. */
function halves(value: number | bigint, name: string): [number, number] {
  if (typeof value === 'bigint') {
    if (value < 0n || value >= 1n << 64n) throw new RangeError(`Pcg32: ${name} must lie in [0, 2^64), got ${value}`);
    return [Number(value >> 32n), Number(value & 0xffffffffn)];
  }
  if (!Number.isSafeInteger(value) || value < 0) {
    throw new RangeError(`Pcg32: ${name} must be a non-negative safe integer (or a bigint), got ${value}`);
  }
  return [Math.floor(value / TWO32) >>> 0, value >>> 0];
}

/**
 * PCG32 generator with Box–Muller normals. Same seed and stream give the same sequence on
 * every platform. `new Pcg32(42n, 54n)` reproduces the reference demo of O'Neill's C library.
 */
export class Pcg32 {
  private hi = 0;
  private lo = 0;
  private readonly incHi: number;
  private readonly incLo: number;
  private spare = 0;
  private hasSpare = false;

  /** seed: initial state; stream: selects one of 2^63 independent sequences (default 0). */
  constructor(seed: number | bigint, stream: number | bigint = 0) {
    const [sh, sl] = halves(seed, 'seed');
    const [qh, ql] = halves(stream, 'stream');
    // increment = (stream << 1) | 1, modulo 2^64 (pcg32_srandom_r).
    this.incHi = ((qh << 1) | (ql >>> 31)) >>> 0;
    this.incLo = ((ql << 1) | 1) >>> 0;
    this.advance();
    this.add(sh, sl);
    this.advance();
  }

  private add(h: number, l: number): void {
    const low = this.lo + l;
    this.lo = low >>> 0;
    this.hi = (this.hi + h + (low >= TWO32 ? 1 : 0)) >>> 0;
  }

  /** state <- state * MUL + inc (mod 2^64), by 16-bit limbs for the low product. */
  private advance(): void {
    const al = this.lo;
    const a0 = al & 0xffff, a1 = al >>> 16;
    const b0 = MUL_LO & 0xffff, b1 = MUL_LO >>> 16;
    const p00 = a0 * b0, p01 = a0 * b1, p10 = a1 * b0, p11 = a1 * b1;
    const mid = (p00 >>> 16) + (p01 & 0xffff) + (p10 & 0xffff);
    const carryHi = p11 + (p01 >>> 16) + (p10 >>> 16) + (mid >>> 16);
    const lo = (((mid & 0xffff) << 16) | (p00 & 0xffff)) >>> 0;
    const hi = (carryHi + Math.imul(this.hi, MUL_LO) + Math.imul(al, MUL_HI)) >>> 0;
    this.hi = hi;
    this.lo = lo;
    this.add(this.incHi, this.incLo);
  }

  /** Next unsigned 32-bit output. */
  nextUint32(): number {
    const oh = this.hi, ol = this.lo;
    this.advance();
    // xorshifted = ((old >> 18) ^ old) >> 27, low 32 bits; rot = old >> 59.
    const xh = oh ^ (oh >>> 18);
    const xl = ol ^ ((oh << 14) | (ol >>> 18));
    const xs = ((xl >>> 27) | (xh << 5)) >>> 0;
    const rot = oh >>> 27;
    return ((xs >>> rot) | (xs << ((32 - rot) & 31))) >>> 0;
  }

  /** Uniform double in [0, 1) with 53 random bits (two outputs). */
  uniform(): number {
    const a = this.nextUint32() >>> 5; // 27 bits
    const b = this.nextUint32() >>> 6; // 26 bits
    return (a * 67108864 + b) / 9007199254740992;
  }

  /** Standard normal deviate (Box–Muller; the second value of each pair is kept for the next call). */
  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    const u1 = 1 - this.uniform(); // (0, 1]: log is finite
    const u2 = this.uniform();
    const r = Math.sqrt(-2 * Math.log(u1));
    this.spare = r * Math.sin(2 * Math.PI * u2);
    this.hasSpare = true;
    return r * Math.cos(2 * Math.PI * u2);
  }

  /** A new array of n normal deviates with the given standard deviation (sigma >= 0). */
  normals(n: number, sigma = 1): Float64Array {
    if (!Number.isInteger(n) || n < 0) throw new RangeError(`Pcg32.normals: n must be a non-negative integer, got ${n}`);
    if (!(sigma >= 0) || !Number.isFinite(sigma)) throw new RangeError(`Pcg32.normals: sigma must be finite and >= 0, got ${sigma}`);
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) out[i] = sigma * this.normal();
    return out;
  }
}
