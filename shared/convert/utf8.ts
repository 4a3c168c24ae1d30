/**
 * UTF-8 (RFC 3629) encode/decode without TextEncoder/TextDecoder, which the shared/ type
 * environment (ES2023 lib, no DOM) does not declare. Used for the GLB JSON chunk.
 */

/** Encode a JavaScript string (UTF-16, surrogate pairs joined) as UTF-8 bytes. */
export function encodeUtf8(s: string): Uint8Array {
  const out: number[] = [];
  for (let i = 0; i < s.length; i++) {
    let c = s.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff && i + 1 < s.length) {
      const d = s.charCodeAt(i + 1);
      if (d >= 0xdc00 && d <= 0xdfff) {
        c = 0x10000 + ((c - 0xd800) << 10) + (d - 0xdc00);
        i++;
      }
    }
    if (c < 0x80) out.push(c);
    else if (c < 0x800) out.push(0xc0 | (c >> 6), 0x80 | (c & 63));
    else if (c < 0x10000) out.push(0xe0 | (c >> 12), 0x80 | ((c >> 6) & 63), 0x80 | (c & 63));
    else out.push(0xf0 | (c >> 18), 0x80 | ((c >> 12) & 63), 0x80 | ((c >> 6) & 63), 0x80 | (c & 63));
  }
  return Uint8Array.from(out);
}

/** Decode UTF-8 bytes; a malformed sequence throws naming its byte offset. */
export function decodeUtf8(b: Uint8Array): string {
  const parts: string[] = [];
  let codes: number[] = [];
  for (let i = 0; i < b.length; ) {
    const c = b[i];
    let cp: number;
    let extra: number;
    if (c < 0x80) { cp = c; extra = 0; }
    else if ((c & 0xe0) === 0xc0) { cp = c & 31; extra = 1; }
    else if ((c & 0xf0) === 0xe0) { cp = c & 15; extra = 2; }
    else if ((c & 0xf8) === 0xf0) { cp = c & 7; extra = 3; }
    else throw new Error(`UTF-8: invalid byte 0x${c.toString(16)} at offset ${i}`);
    if (i + extra >= b.length) throw new Error(`UTF-8: truncated sequence at offset ${i}`);
    for (let k = 1; k <= extra; k++) {
      const d = b[i + k];
      if ((d & 0xc0) !== 0x80) throw new Error(`UTF-8: invalid continuation byte at offset ${i + k}`);
      cp = (cp << 6) | (d & 63);
    }
    i += extra + 1;
    codes.push(cp);
    if (codes.length >= 4096) { parts.push(String.fromCodePoint(...codes)); codes = []; }
  }
  parts.push(String.fromCodePoint(...codes));
  return parts.join('');
}
