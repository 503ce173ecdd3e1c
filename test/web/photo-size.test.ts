// The stored photo's pixel size (web/photos/resize.ts scaledSize): the long edge becomes 2,048 px with the
// aspect kept (exact arithmetic), a smaller picture is never scaled up, and a picture with no pixels is
// refused with a sentence. The hash helper agrees with Node's crypto (FIPS 180-2 Appendix B.1 for "abc").
import { describe, expect, it } from 'vitest';
import { scaledSize } from '../../web/photos/resize';
import { sha256Of } from '../../web/photos/hash';
import { PHOTO_LONG_EDGE_PX } from '../../web/photos/resize-protocol';

describe('the stored size of a photo', () => {
  it('brings the long edge to 2,048 px and keeps the aspect', () => {
    expect(PHOTO_LONG_EDGE_PX).toBe(2048);
    expect(scaledSize(4000, 3000)).toEqual({ width: 2048, height: 1536 }); // 12 MP, 4:3
    expect(scaledSize(3000, 4000)).toEqual({ width: 1536, height: 2048 });
    expect(scaledSize(4032, 2268)).toEqual({ width: 2048, height: 1152 }); // 16:9: 2268 × 2048/4032 = 1152 exactly
    expect(scaledSize(6000, 1000)).toEqual({ width: 2048, height: 341 }); // 341.33 rounds to 341
  });

  it('never scales up', () => {
    expect(scaledSize(2048, 100)).toEqual({ width: 2048, height: 100 });
    expect(scaledSize(640, 480)).toEqual({ width: 640, height: 480 });
    expect(scaledSize(1, 1)).toEqual({ width: 1, height: 1 });
  });

  it('keeps at least one pixel on the short side', () => {
    expect(scaledSize(20_000, 1)).toEqual({ width: 2048, height: 1 });
  });

  it('refuses a picture with no pixels', () => {
    expect(() => scaledSize(0, 100)).toThrow('A picture needs a width and height of at least 1 px; this one is 0 × 100.');
    expect(() => scaledSize(Number.NaN, 100)).toThrow(RangeError);
  });

  it('hashes with SHA-256', async () => {
    // FIPS 180-2, Appendix B.1.
    expect(await sha256Of(new TextEncoder().encode('abc').buffer as ArrayBuffer)).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});
