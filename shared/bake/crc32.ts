/**
 * CRC-32 as used by zlib, PNG and ZIP (ISO-HDLC): reflected polynomial 0xEDB88320, initial value
 * 0xFFFFFFFF, final XOR 0xFFFFFFFF. Table-driven, one byte at a time (Sarwate 1988).
 * Check value: crc32("123456789") = 0xCBF43926 (common practice).
 */

const TABLE: Uint32Array = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** CRC-32 of bytes[start, end), as an unsigned 32-bit integer. */
export function crc32(bytes: Uint8Array, start = 0, end = bytes.length): number {
  let c = 0xffffffff;
  for (let i = start; i < end; i++) c = TABLE[(c ^ bytes[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
