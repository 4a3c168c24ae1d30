import { describe, expect, it } from 'vitest';
import { curveJsonSchema, MAX_KEYS, parseCurveDocument } from '../../../shared/curve';
import { makeDoc } from './helpers';

// The limits are the project's own (issue 4 / docs/curve-format.md); messages must name the field.
const good = () => makeDoc([{ time: 0, value: 0 }, { time: 0.5, value: 1 }, { time: 1, value: 0.5 }]);
function issuesOf(doc: unknown) {
  const r = parseCurveDocument(doc);
  if (r.ok) throw new Error('expected the document to be rejected');
  return r.issues;
}

describe('parseCurveDocument', () => {
  it('accepts a valid document and returns it', () => {
    const r = parseCurveDocument(good());
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.doc.keys).toHaveLength(3);
  });
  it('a single key is a constant and valid; zero keys are not', () => {
    expect(parseCurveDocument(makeDoc([{ time: 2, value: 3 }])).ok).toBe(true);
    const iss = issuesOf({ ...good(), keys: [], segments: [] });
    expect(iss[0]).toMatchObject({ path: 'keys' });
    expect(iss[0].message).toMatch(/^keys: .*at least one key/);
  });
  it('non-finite and wrong-typed numbers name the field path', () => {
    const d = good() as any;
    d.keys[1].time = Infinity;
    d.keys[2].slopeIn = NaN;
    d.keys[0].value = '1';
    const iss = issuesOf(d);
    expect(iss.map((i) => i.path).sort()).toEqual(['keys[0].value', 'keys[1].time', 'keys[2].slopeIn']);
    for (const i of iss) expect(i.message.startsWith(i.path + ':')).toBe(true);
    expect(iss.find((i) => i.path === 'keys[1].time')!.message).toMatch(/finite number/);
  });
  it(`more than MAX_KEYS = ${MAX_KEYS} keys is refused`, () => {
    const keys = Array.from({ length: MAX_KEYS + 1 }, (_, i) => ({ time: i, value: 0 }));
    const iss = issuesOf(makeDoc(keys));
    expect(iss.some((i) => i.path === 'keys' && /at most 10000 keys/.test(i.message))).toBe(true);
  });
  it('times must not decrease; two keys may share a time (a jump), three may not', () => {
    const back = makeDoc([{ time: 0 }, { time: 1 }, { time: 0.5 }]);
    expect(issuesOf(back)[0]).toMatchObject({ path: 'keys[2].time' });
    expect(parseCurveDocument(makeDoc([{ time: 0 }, { time: 1, value: 0 }, { time: 1, value: 2 }, { time: 2 }])).ok).toBe(true);
    const three = issuesOf(makeDoc([{ time: 0 }, { time: 1 }, { time: 1 }, { time: 1 }]));
    expect(three[0].path).toBe('keys[3].time');
    expect(three[0].message).toMatch(/three keys/);
  });
  it('segments.length must be keys.length − 1', () => {
    const d = good();
    d.segments.pop();
    const iss = issuesOf(d);
    expect(iss[0].path).toBe('segments');
    expect(iss[0].message).toMatch(/keys\.length − 1 = 2/);
  });
  it('bezier needs its handles, inside the segment; shape needs its shape', () => {
    const d = good();
    d.segments[0] = { kind: 'bezier' };
    d.segments[1] = { kind: 'shape' };
    const iss = issuesOf(d);
    expect(iss.map((i) => i.path)).toEqual(['segments[0].bezier', 'segments[1].shape']);
    const e = good();
    e.segments[1] = { kind: 'bezier', bezier: { h1: { time: 0.4, value: 0 }, h2: { time: 0.9, value: 1 } } };
    const iss2 = issuesOf(e);
    expect(iss2[0].path).toBe('segments[1].bezier.h1.time');
    expect(iss2[0].message).toMatch(/inside its segment \[0\.5, 1\]/);
  });
  it('shape parameters and enums are checked with the field named', () => {
    const d = good();
    d.segments[0] = { kind: 'shape', shape: { family: 'spring', ease: 'out', params: { stiffness: -1 } } };
    d.segments[1] = { kind: 'shape', shape: { family: 'wobble' as never, ease: 'in' } };
    const iss = issuesOf(d);
    expect(iss).toContainEqual({ path: 'segments[0].shape.params.stiffness', message: 'segments[0].shape.params.stiffness: stiffness must be greater than 0' });
    expect(iss.find((i) => i.path === 'segments[1].shape.family')!.message).toMatch(/family must be one of sine, quad/);
  });
  it('frameRate > 0, name non-empty, unknown fields refused, joined manual slopes equal', () => {
    const d = { ...good(), frameRate: 0, name: '  ', colour: 'red' } as any;
    d.keys[1] = { ...d.keys[1], slopeIn: 1, slopeOut: 2 };
    const iss = issuesOf(d);
    expect(iss.map((i) => i.path).sort()).toEqual(['', 'frameRate', 'keys[1].slopeIn', 'name']);
    expect(iss.find((i) => i.path === 'name')!.message).toBe('name: name must not be empty');
    expect(iss.find((i) => i.path === '')!.message).toBe('document: unknown field colour');
    const j = good();
    j.keys[1] = { ...j.keys[1], slopeIn: 1, slopeOut: 2 };
    expect(issuesOf(j)[0]).toMatchObject({ path: 'keys[1].slopeIn' });
  });
});

describe('curveJsonSchema', () => {
  it('is a draft 2020-12 JSON Schema of the document fields', () => {
    const s = curveJsonSchema() as any;
    expect(s.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    expect(s.required).toEqual(expect.arrayContaining(['format', 'version', 'name', 'keys', 'segments', 'before', 'after']));
    expect(s.properties.keys.maxItems).toBe(MAX_KEYS);
    expect(s.properties.keys.items.properties.rule.enum).toEqual(['manual', 'catmull-rom', 'monotone', 'zero', 'secant']);
    expect(s.additionalProperties).toBe(false);
  });
});
