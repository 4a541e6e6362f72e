/**
 * FNV-1a 64-bit over UTF-16 code units, as 16 hex digits.
 * Used for fingerprints and policy versions: pure and synchronous, so the browser, the CLI
 * and the server compute the same value without node:crypto. Not for secrets.
 */
export function fnv1a64(text: string): string {
  // Offset basis 0xcbf29ce484222325 and prime 0x100000001b3 (FNV reference parameters),
  // held as four 16-bit limbs so no BigInt is needed.
  let h0 = 0x2325;
  let h1 = 0x8422;
  let h2 = 0x9ce4;
  let h3 = 0xcbf2;
  for (let i = 0; i < text.length; i++) {
    h0 ^= text.charCodeAt(i);
    // prime = 2^40 + 0x1b3: the 2^40 part shifts limbs 0 and 1 into limbs 2 and 3, by 8 more bits.
    const t0 = h0 * 0x1b3;
    const t1 = h1 * 0x1b3;
    const t2 = h2 * 0x1b3 + (h0 << 8);
    const t3 = h3 * 0x1b3 + (h1 << 8);
    const c1 = t1 + (t0 >>> 16);
    const c2 = t2 + (c1 >>> 16);
    h0 = t0 & 0xffff;
    h1 = c1 & 0xffff;
    h2 = c2 & 0xffff;
    h3 = (t3 + (c2 >>> 16)) & 0xffff;
  }
  return [h3, h2, h1, h0].map((limb) => limb.toString(16).padStart(4, '0')).join('');
}
