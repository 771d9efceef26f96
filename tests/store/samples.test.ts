import { describe, expect, it } from 'vitest';
import { blobToFloat64, float64ToBlob, sha256Hex } from '../../src-main/store/samples.ts';
import { AWKWARD, sameBytes } from './helpers.ts';

describe('sample blobs', () => {
  it('writes IEEE 754 binary64 little-endian: 1.0 is 00..f03f, -2.5 is 00..04c0, -0 is 00..80', () => {
    // IEEE 754 encodings (common practice): 1.0 = 0x3FF0000000000000, -2.5 = 0xC004000000000000, -0 = 0x8000000000000000.
    expect(Buffer.from(float64ToBlob(new Float64Array([1, -2.5, -0]))).toString('hex'))
      .toBe('000000000000f03f' + '00000000000004c0' + '0000000000000080');
  });

  it('reads back the same bits, NaN payloads included, into a fresh aligned array', () => {
    const blob = Buffer.concat([Buffer.from([0xff]), Buffer.from(float64ToBlob(AWKWARD))]).subarray(1); // misaligned view
    const back = blobToFloat64(blob);
    expect(sameBytes(back, AWKWARD)).toBe(true);
    expect(back.buffer).not.toBe(blob.buffer);
    // The payload NaN 0x7ff8000000000123 keeps its low bits (IEEE 754 NaN payload).
    expect(new DataView(back.buffer).getUint32(8, true)).toBe(0x123);
  });

  it('checksums with SHA-256 as in the FIPS 180-2 examples', () => {
    // FIPS 180-2 Appendix B.1 ("abc") and the well-known digest of the empty message (from memory).
    expect(sha256Hex(Buffer.from('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sha256Hex(new Uint8Array(0))).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });
});
