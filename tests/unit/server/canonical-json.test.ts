import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../../../server/versions/canonical-json';

describe('canonical JSON', () => {
  it('sorts keys at every level by UTF-16 code units and drops whitespace (RFC 8785 §3.2.3)', () => {
    expect(canonicalJson({ b: 1, a: { d: [3, { z: true, y: null }], c: 'x' } })).toBe('{"a":{"c":"x","d":[3,{"y":null,"z":true}]},"b":1}');
    // RFC 8785 §3.2.3 orders by code units: "B" (0x42) before "a" (0x61) before "é" (0xE9)
    expect(canonicalJson({ é: 1, a: 2, B: 3 })).toBe('{"B":3,"a":2,"é":1}');
  });

  it('writes numbers as ECMAScript Number-to-String (RFC 8785 §3.2.2.3 examples)', () => {
    // values from RFC 8785 Appendix B, from memory: 1e21 → "1e+21", 0.000001 → "0.000001", 1e-7 → "1e-7", -0 → "0"
    expect(canonicalJson([1e21, 0.000001, 1e-7, -0, 333333333.3333333])).toBe('[1e+21,0.000001,1e-7,0,333333333.3333333]');
    expect(() => canonicalJson({ x: Number.NaN })).toThrow(/finite/);
  });

  it('is the same for the same content whatever the key order it was built in', () => {
    expect(canonicalJson({ x: 1, y: [1, 2] })).toBe(canonicalJson({ y: [1, 2], x: 1 }));
  });
});
