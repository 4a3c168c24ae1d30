/**
 * fast-check arbitraries for bad input: anything at all, wrong types per field of a valid body, huge
 * strings, deep nesting, prototype-pollution keys, NaN-like strings and awkward unicode. Each produces
 * the raw JSON text to send (so keys like "__proto__" arrive as own properties, as from a real client).
 */
import fc from 'fast-check';

/** Strings that look like numbers to a careless parser (common practice in fuzzing number fields). */
export const NAN_LIKE = ['NaN', '-NaN', 'Infinity', '-Infinity', '1e999', '-1e999', '0x10', '1_000', '', ' ', '-0', '٣', '１', '1,5', 'null', 'undefined', 'true'];

/** Unicode that breaks naive handling: NUL, lone surrogates, RTL override, combining marks, emoji ZWJ. */
export const AWKWARD_STRINGS = ['\u0000', 'a\u0000b', '\ud800', '\udfff', '\u202etxt.exe', 'e\u0301\u0301\u0301', '👩‍👩‍👧‍👦', '\ufeff', '\u2028\u2029', '<script>alert(1)</script>', "'; DROP TABLE packs; --", '../../etc/passwd', '%00', '${jndi:x}'];

export const PROTO_KEYS = ['__proto__', 'constructor', 'prototype'];

/** A value of a different JSON type (or a NaN-like string) to put where a field's value was. */
export function wrongValue(original: unknown): fc.Arbitrary<unknown> {
  const choices: fc.Arbitrary<unknown>[] = [
    fc.constant(null),
    fc.constantFrom(...NAN_LIKE),
    fc.constantFrom(...AWKWARD_STRINGS),
    fc.boolean(),
    fc.array(fc.integer(), { maxLength: 3 }),
    fc.dictionary(fc.string({ maxLength: 5 }), fc.integer(), { maxKeys: 3 }),
    fc.oneof(fc.constant(-1), fc.constant(0), fc.constant(2 ** 53), fc.constant(-(2 ** 53)), fc.constant(1.5), fc.constant(1e308)),
  ];
  if (typeof original === 'number') choices.push(fc.string({ maxLength: 8 }));
  if (typeof original === 'string') choices.push(fc.double(), fc.string({ minLength: 5000, maxLength: 20_000 }));
  return fc.oneof(...choices);
}

/** Every path to a leaf (and to each object/array) of a JSON value. */
export function pathsOf(v: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  const out: (string | number)[][] = [];
  if (Array.isArray(v)) v.forEach((x, i) => out.push([...prefix, i], ...pathsOf(x, [...prefix, i])));
  else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) out.push([...prefix, k], ...pathsOf(x, [...prefix, k]));
  return out;
}

export function getAt(v: unknown, path: (string | number)[]): unknown {
  return path.reduce<unknown>((o, k) => (o as Record<string | number, unknown> | undefined)?.[k], v);
}

export function setAt<T>(v: T, path: (string | number)[], value: unknown): T {
  const copy = structuredClone(v) as Record<string | number, unknown>;
  let o = copy;
  for (const k of path.slice(0, -1)) o = o[k] as Record<string | number, unknown>;
  o[path[path.length - 1]!] = value;
  return copy as T;
}

/** A valid body with one field (at any depth) replaced by a wrong value: [path, mutated body]. */
export function oneFieldWrong(valid: object): fc.Arbitrary<{ path: (string | number)[]; body: unknown }> {
  const paths = pathsOf(valid);
  if (paths.length === 0) return fc.constant({ path: [], body: valid });
  return fc.constantFrom(...paths).chain((path) => wrongValue(getAt(valid, path)).map((w) => ({ path, body: setAt(valid, path, w) })));
}

/** JSON text of `valid` with a prototype-pollution key added at the top or inside an object field. */
export function pollutedJson(valid: object): fc.Arbitrary<string> {
  return fc.tuple(fc.constantFrom(...PROTO_KEYS), fc.boolean()).map(([key, nested]) => {
    const text = JSON.stringify(valid);
    const injected = `"${key}":{"polluted":"yes","isAdmin":true,"role":"admin"}`;
    if (nested) {
      const i = text.indexOf(':{');
      if (i > 0) return `${text.slice(0, i + 2)}${injected},${text.slice(i + 2)}`;
    }
    return text === '{}' ? `{${injected}}` : `{${injected},${text.slice(1)}`;
  });
}

/** Arrays or objects nested `depth` deep. */
export const deepJson = fc.tuple(fc.integer({ min: 50, max: 5000 }), fc.boolean()).map(([depth, arrays]) =>
  arrays ? `${'['.repeat(depth)}${']'.repeat(depth)}` : `${'{"a":'.repeat(depth)}1${'}'.repeat(depth)}`,
);

/** A valid body with every string field replaced by a huge string. */
export function hugeStrings(valid: object): fc.Arbitrary<string> {
  return fc.integer({ min: 10_000, max: 400_000 }).map((n) => JSON.stringify(valid, (_k, v) => (typeof v === 'string' ? 'x'.repeat(n) : v)));
}

/** Anything JSON can carry (fast-check's anything, stringified; undefined becomes no body). */
export const anyJson = fc
  .anything({ maxDepth: 4, withObjectString: true, withNullPrototype: true, maxKeys: 6 })
  .map((v) => JSON.stringify(v) ?? '');

/** Text that is not JSON at all (express.json refuses it with 400). */
export const notJson = fc
  .oneof(
    fc.constantFrom('{', '{"a":', "{'a':1}", '[1,]', '{"a":1,}', 'undefined', 'NaN', '{"a":NaN}', '{"a":01}', '\u0000', '{"a":"\u0001"}', '<xml/>', '--'),
    fc.string({ minLength: 1, maxLength: 40 }),
  )
  .filter((t) => {
    try {
      JSON.parse(t);
      return false;
    } catch {
      return true;
    }
  });

/** A query string with odd keys and values (arrays, brackets, pollution keys, unicode, long values). */
export const junkQuery = fc
  .array(
    fc.tuple(
      fc.oneof(fc.string({ maxLength: 10 }), fc.constantFrom('__proto__[x]', 'constructor[prototype][x]', 'a[b][c]', 'against', 'revision', 'page', 'limit', 'q[]')),
      fc.oneof(fc.string({ maxLength: 20 }), fc.constantFrom(...NAN_LIKE), fc.constantFrom(...AWKWARD_STRINGS), fc.constant('x'.repeat(5000))),
    ),
    { maxLength: 6 },
  )
  .map((pairs) => pairs.map(([k, v]) => `${percentEncode(k)}=${percentEncode(v)}`).join('&'));

/** Percent-encodes every UTF-8 byte of `s` except unreserved characters (RFC 3986 §2.3); a lone
 * surrogate becomes U+FFFD's bytes, as a browser's encoder would send it. */
export function percentEncode(s: string): string {
  let out = '';
  for (const b of Buffer.from(s, 'utf8')) out += /[A-Za-z0-9\-._~]/.test(String.fromCharCode(b)) ? String.fromCharCode(b) : `%${b.toString(16).toUpperCase().padStart(2, '0')}`;
  return out;
}

/** Strings to put into a path parameter (ids, slugs, numbers). */
export const junkParam = fc.oneof(
  fc.string({ minLength: 1, maxLength: 30 }),
  fc.constantFrom(...NAN_LIKE.filter(Boolean), ...AWKWARD_STRINGS, '00000000-0000-0000-0000-000000000000', 'x'.repeat(3000), '9'.repeat(40), '-1', '0', '1.5', '1e3'),
);
