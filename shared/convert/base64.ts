/**
 * Base64 (RFC 4648 §4, standard alphabet, with '=' padding) without Node's Buffer,
 * so shared/ runs unchanged in the browser and in Node.
 */

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

const DECODE = (() => {
  const table = new Int16Array(128).fill(-1);
  for (let i = 0; i < ALPHABET.length; i++) table[ALPHABET.charCodeAt(i)] = i;
  // RFC 4648 §5 URL-safe alphabet is accepted on input as well.
  table['-'.charCodeAt(0)] = 62;
  table['_'.charCodeAt(0)] = 63;
  return table;
})();

/** Encode bytes: every 3 bytes become 4 characters of 6 bits each. */
export function encodeBase64(bytes: Uint8Array): string {
  const parts: string[] = [];
  const CHUNK = 3 * 4096;
  for (let start = 0; start < bytes.length; start += CHUNK) {
    const end = Math.min(bytes.length, start + CHUNK);
    let s = '';
    for (let i = start; i < end; i += 3) {
      const b0 = bytes[i];
      const b1 = i + 1 < end ? bytes[i + 1] : 0;
      const b2 = i + 2 < end ? bytes[i + 2] : 0;
      const n = (b0 << 16) | (b1 << 8) | b2;
      s += ALPHABET[(n >> 18) & 63] + ALPHABET[(n >> 12) & 63];
      s += i + 1 < end ? ALPHABET[(n >> 6) & 63] : '=';
      s += i + 2 < end ? ALPHABET[n & 63] : '=';
    }
    parts.push(s);
  }
  return parts.join('');
}

/** Decode base64 (padding optional, whitespace ignored); throws naming the first bad character. */
export function decodeBase64(text: string): Uint8Array {
  const clean = text.replace(/[\s]/g, '').replace(/=+$/, '');
  const out = new Uint8Array(Math.floor((clean.length * 6) / 8));
  let acc = 0;
  let bits = 0;
  let o = 0;
  for (let i = 0; i < clean.length; i++) {
    const c = clean.charCodeAt(i);
    const v = c < 128 ? DECODE[c] : -1;
    if (v < 0) throw new Error(`base64: invalid character '${clean[i]}' at position ${i}`);
    acc = (acc << 6) | v;
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      out[o++] = (acc >> bits) & 255;
    }
  }
  return out.subarray(0, o);
}
