import { describe, expect, it } from 'vitest';
import { DEMO_PROFILES } from '../../../shared/bake';
import { localDocumentSource, type KeyValueStorage } from '../../../src/features/editor/store/document-source';
import { EDITOR_EXAMPLES } from '../../../src/features/editor/store/examples';
import { patchBezierHandle, patchKey, patchSegment, shapeEverySegment } from '../../../src/features/editor/store/edits';
import { evaluate, prepareCurve, shapeValue } from '../../../shared/curve';
import { checkEdit, fieldOf, parseNumberField } from '../../../src/features/editor/key-card/validate-edit';
import { bakeForStrip } from '../../../src/features/editor/target-strip/bake-strip';
import { poolSize } from '../../../src/features/editor/target-strip/bake-runner';

/** An in-memory Web Storage (the part the source uses). */
function memoryStorage(): KeyValueStorage & { map: Map<string, string> } {
  const map = new Map<string, string>();
  return { map, getItem: (k) => map.get(k) ?? null, setItem: (k, v) => void map.set(k, v) };
}

const panel = EDITOR_EXAMPLES[0].doc;

describe('local document source', () => {
  it('loads nothing at first, then what was saved, with its version', async () => {
    const storage = memoryStorage();
    const src = localDocumentSource(storage);
    expect(await src.load()).toEqual({ ok: true, loaded: null });
    expect(await src.save(panel, null)).toEqual({ ok: true, version: 1 });
    const r = await src.load();
    expect(r.ok && r.loaded).toEqual({ doc: panel, version: 1 });
  });

  it('a save naming an old version is a conflict that returns the stored document', async () => {
    const storage = memoryStorage();
    const a = localDocumentSource(storage);
    const b = localDocumentSource(storage);
    await a.save(panel, null); // v1
    const other = { ...panel, name: 'edited-in-another-tab' };
    expect(await b.save(other, 1)).toEqual({ ok: true, version: 2 });
    const stale = await a.save({ ...panel, name: 'mine' }, 1);
    expect(stale).toEqual({ ok: false, conflict: { doc: other, version: 2 } });
    expect(await a.overwrite({ ...panel, name: 'mine' })).toEqual({ version: 3 });
  });

  it('a broken stored document is reported with the schema issue, not loaded', async () => {
    const storage = memoryStorage();
    storage.setItem('tangentry.editor.scratch.v1', JSON.stringify({ version: 4, doc: { ...panel, frameRate: -1 } }));
    const r = await localDocumentSource(storage).load();
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues?.[0].path).toBe('frameRate');
    storage.setItem('tangentry.editor.scratch.v1', '{not json');
    expect((await localDocumentSource(storage).load()).ok).toBe(false);
  });
});

describe('key card validation (shared schema)', () => {
  it('a time before the previous key is refused, with the message on the time field', () => {
    const r = checkEdit(patchKey(panel, 1, { time: -0.1 }), 1);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.time).toMatch(/must not be before the previous key's time/);
  });
  it('a time past the next key is filed under the edited key too', () => {
    const r = checkEdit(patchKey(panel, 1, { time: 0.5 }), 1);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors).toEqual({ time: "time must not be after the next key's time (0.45 s)" });
  });
  it('a shape parameter out of range names the parameter', () => {
    const doc = patchSegment(panel, 1, { kind: 'shape', shape: { family: 'elastic', ease: 'out', params: { period: -1 } } });
    const r = checkEdit(doc, 1);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.period).toMatch(/period must be greater than 0/);
  });
  it('a valid edit is settled (slope rules re-resolved)', () => {
    const r = checkEdit(patchKey(panel, 1, { rule: 'catmull-rom' }), 1);
    expect(r.ok).toBe(true);
    // catmull-rom: (v₂ − v₀)/(t₂ − t₀) = (1 − 0)/(0.45 − 0) (Catmull & Rom 1974, REFERENCES.md)
    if (r.ok) expect(r.doc.keys[1].slopeOut).toBeCloseTo(1 / 0.45, 12);
  });
  it('a Bézier handle typed outside its segment names that handle field', () => {
    const a = panel.keys[0], b = panel.keys[1], h = b.time - a.time;
    const bez = patchSegment(panel, 0, { kind: 'bezier', bezier: { h1: { time: a.time + h / 3, value: a.value }, h2: { time: a.time + (2 * h) / 3, value: b.value } } });
    const r = checkEdit(patchBezierHandle(bez, 0, 'h2', 'time', b.time + 1), 0);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors['h2.time']).toMatch(/must lie inside its segment/);
    const ok = checkEdit(patchBezierHandle(bez, 0, 'h1', 'value', 0.25), 0);
    expect(ok.ok).toBe(true);
    if (ok.ok) expect(ok.doc.segments[0].bezier!.h1).toEqual({ time: a.time + h / 3, value: 0.25 });
    // a segment that is not a Bézier is left alone
    expect(patchBezierHandle(panel, 0, 'h1', 'time', 0)).toBe(panel);
  });
  it('a shape on the whole curve eases every segment from key to key, keys untouched', () => {
    const shape = { family: 'back' as const, ease: 'out' as const, params: { overshoot: 1.2 } };
    const r = checkEdit(shapeEverySegment(panel, shape), 0);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.doc.segments).toHaveLength(panel.segments.length);
    expect(r.doc.keys.map((k) => [k.time, k.value])).toEqual(panel.keys.map((k) => [k.time, k.value]));
    const c = prepareCurve(r.doc);
    for (let i = 0; i < panel.segments.length; i++) {
      expect(r.doc.segments[i]).toEqual({ kind: 'shape', shape });
      const a = panel.keys[i], b = panel.keys[i + 1], d = b.time - a.time;
      // value = a + (b − a)·f(s) at s = ½ (the engine's own shape function, tested against CSS/d3-ease elsewhere)
      expect(evaluate(c, a.time + d / 2)).toBeCloseTo(a.value + (b.value - a.value) * shapeValue(shape, 0.5, 0, d), 12);
    }
  });
  it('field paths and typed numbers', () => {
    expect(fieldOf('segments[1].bezier.h1.time', 1)).toBe('h1.time');
    expect(fieldOf('segments[1].bezier', 1)).toBe('bezier');
    expect(fieldOf('keys[2].slopeIn', 2)).toBe('slopeIn');
    expect(fieldOf('segments[2].shape.params.mass', 2)).toBe('mass');
    expect(parseNumberField('1,5', 'value')).toEqual({ ok: true, value: 1.5 });
    expect(parseNumberField('abc', 'value')).toEqual({ ok: false, error: 'value must be a finite number' });
  });
});

describe('target strip bakes', () => {
  it('bakes the panel example for every demo target with a verdict that matches the numbers', () => {
    for (const p of DEMO_PROFILES) {
      const r = bakeForStrip(panel, p);
      if (!r.ok) { expect(r.verdict).toBe('over'); continue; }
      expect(r.maxError).toBeLessThanOrEqual(r.tolerance);
      expect(r.verdict).toBe(r.maxError / r.tolerance > 0.8 ? 'near' : 'pass');
      expect(r.dotTimes.length).toBe(r.entries);
      expect(r.dotTimes[0]).toBe(0);
    }
  });
  it('keeps a core for the page: pool of cores − 1 workers, at least one', () => {
    expect(poolSize(2, 4)).toBe(1);
    expect(poolSize(8, 4)).toBe(4);
    expect(poolSize(undefined, 4)).toBe(1);
  });
});
