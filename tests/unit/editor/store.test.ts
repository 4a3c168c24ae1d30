import { describe, expect, it } from 'vitest';
import pchip from 'pchip';
import { parseCurveDocument, type CurveDocument, type Key } from '../../../shared/curve';
import { createEditorStore } from '../../../src/features/editor/store/editor-store';
import { addKeyAt, copyKeys, deleteKeys, moveKeys, pasteKeys, setSlope, slopeFromHandle, MAX_HANDLE_SLOPE } from '../../../src/features/editor/store/edits';
import { commandById, commandForKey } from '../../../src/features/editor/commands/commands';

const k = (time: number, value: number, rule: Key['rule'] = 'manual', slope = 0): Key => ({
  time, value, slopeIn: slope, slopeOut: slope, rule, slopes: 'joined',
});

function curve(keys: Key[], frameRate = 30): CurveDocument {
  return {
    format: 'tangentry.curve', version: 1, name: 'test', units: { time: 's', value: 'u' }, before: 'clamp', after: 'clamp',
    frameRate, drives: 'position', tags: [], keys, segments: keys.slice(1).map(() => ({ kind: 'hermite' as const })),
  };
}

const free = { snapping: { frames: false, values: false }, valueStep: 0.01 };
const valid = (d: CurveDocument) => {
  const r = parseCurveDocument(d);
  expect(r.ok ? [] : r.issues).toEqual([]);
};

describe('moveKeys (pure)', () => {
  it('moves from the start document by the offset from the start pointer, not by summing deltas', () => {
    const start = curve([k(0, 0), k(1, 1), k(2, 0)]);
    // many small moves, then the final pointer offset: the result depends only on the final offset
    let d = start;
    for (let i = 1; i <= 10; i++) d = moveKeys(start, [1], 1, 0.01 * i, 0.02 * i, free);
    expect(d.keys[1].time).toBeCloseTo(1.1, 12);
    expect(d.keys[1].value).toBeCloseTo(1.2, 12);
    expect(start.keys[1].time).toBe(1); // input untouched
    valid(d);
  });

  it('snaps the anchor to frames and round values and gives the group the same offset', () => {
    const start = curve([k(0, 0), k(1, 1), k(1.5, 2), k(3, 0)]);
    const d = moveKeys(start, [1, 2], 1, 0.3123, 0.1234, { snapping: { frames: true, values: true }, valueStep: 0.05 });
    // 1.3123 s at 30 fps → frame 39 = 1.3 s; 1.1234 → 1.1 with step 0.05 (nearest multiple)
    expect(d.keys[1].time).toBe(39 / 30);
    expect(d.keys[1].value).toBeCloseTo(1.1, 12);
    expect(d.keys[2].time).toBeCloseTo(1.5 + (39 / 30 - 1), 12);
    expect(d.keys[2].value).toBeCloseTo(2.1, 12);
  });

  it('each snapping switch works alone', () => {
    const start = curve([k(0, 0), k(1, 1), k(3, 0)]);
    const framesOnly = moveKeys(start, [1], 1, 0.3123, 0.1234, { snapping: { frames: true, values: false }, valueStep: 0.05 });
    expect(framesOnly.keys[1].time).toBe(39 / 30);
    expect(framesOnly.keys[1].value).toBeCloseTo(1.1234, 12);
    const valuesOnly = moveKeys(start, [1], 1, 0.3123, 0.1234, { snapping: { frames: false, values: true }, valueStep: 0.05 });
    expect(valuesOnly.keys[1].time).toBeCloseTo(1.3123, 12);
    expect(valuesOnly.keys[1].value).toBeCloseTo(1.1, 12);
  });

  it('stops a key one frame before an unmoved neighbour (keys keep their order)', () => {
    const start = curve([k(0, 0), k(1, 1), k(2, 0)]);
    const d = moveKeys(start, [1], 1, 5, 0, { snapping: { frames: true, values: false }, valueStep: 0.01 });
    expect(d.keys[1].time).toBeCloseTo(2 - 1 / 30, 12);
    valid(d);
  });

  it('re-resolves slope rules after a move: monotone keys take the Fritsch–Carlson slopes of the new values', () => {
    // REFERENCES.md worked example x = [0,1,2,3], y = [0,0.5,2,2.1] → [0.5, 1, 0.297683, 0.037210];
    // checked against npm pchip 1.0.2 slopes_monotone. Start from y[2] = 1.5 and move it to 2.
    const start = curve([k(0, 0, 'monotone'), k(1, 0.5, 'monotone'), k(2, 1.5, 'monotone'), k(3, 2.1, 'monotone')]);
    const d = moveKeys(start, [2], 2, 0, 0.5, free);
    const ref = pchip.slopes_monotone([[0, 0], [1, 0.5], [2, 2], [3, 2.1]]) as number[];
    const got = d.keys.map((x) => x.slopeOut);
    for (let i = 0; i < 4; i++) expect(got[i]).toBeCloseTo(ref[i], 6);
    expect(got[2]).toBeCloseTo(0.297683, 6); // REFERENCES.md
  });

  it('catmull-rom keys follow a moved neighbour: (p₊ − p₋)/(t₊ − t₋)', () => {
    // REFERENCES.md: Catmull & Rom on x = [0,1,2,3], y = [0,0.5,2,2.1] → [0.5, 1, 0.8, 0.1]
    const start = curve([k(0, 0, 'catmull-rom'), k(1, 0.5, 'catmull-rom'), k(2, 1, 'catmull-rom'), k(3, 2.1, 'catmull-rom')]);
    const d = moveKeys(start, [2], 2, 0, 1, free);
    expect(d.keys.map((x) => x.slopeIn)).toEqual([0.5, 1, 0.8, 0.1].map((x) => expect.closeTo(x, 12)));
  });

  it('maps bezier handles with a moved end key and keeps them inside the segment', () => {
    const start: CurveDocument = {
      ...curve([k(0, 0), k(1, 1)]),
      segments: [{ kind: 'bezier', bezier: { h1: { time: 0.25, value: 0 }, h2: { time: 0.75, value: 1 } } }],
    };
    const d = moveKeys(start, [1], 1, 1, 0.5, free);
    expect(d.segments[0].bezier).toEqual({ h1: { time: 0.5, value: 0 }, h2: { time: 1.5, value: 1.5 } });
    valid(d);
  });
});

describe('slope handles', () => {
  it('the slope is the line from the key to the pointer; a joined key turns both sides', () => {
    const key = k(1, 1);
    expect(slopeFromHandle(key, 'out', 1.5, 2)).toBe(2);
    expect(slopeFromHandle(key, 'in', 0.5, 0)).toBe(2);
    // pointer on the wrong side gives the steepest slope, in the direction the pointer went
    expect(slopeFromHandle(key, 'out', 0.9, 2)).toBe(MAX_HANDLE_SLOPE);
    const doc = curve([k(0, 0, 'catmull-rom'), k(1, 1, 'catmull-rom'), k(2, 0, 'catmull-rom')]);
    const d = setSlope(doc, 1, 'out', 3);
    expect(d.keys[1]).toMatchObject({ rule: 'manual', slopeIn: 3, slopeOut: 3 });
    valid(d);
  });

  it('a split key turns only the dragged side', () => {
    const doc = curve([k(0, 0), { ...k(1, 1), slopes: 'split' }, k(2, 0)]);
    const d = setSlope(doc, 1, 'in', -4);
    expect(d.keys[1]).toMatchObject({ slopeIn: -4, slopeOut: 0 });
  });
});

describe('add, delete, copy and paste keys', () => {
  it('adds a key on the curve without changing its value there', () => {
    const doc = curve([k(0, 0, 'manual', 0), k(1, 1, 'manual', 0)]);
    const r = addKeyAt(doc, 0.5);
    expect(r.index).toBe(1);
    expect(r.doc.keys[1].value).toBeCloseTo(0.5, 12); // smoothstep at ½ (glTF 2.0 Appendix C hermite with zero slopes)
    expect(r.doc.keys[1].slopeOut).toBeCloseTo(1.5, 12); // d/dt (3s² − 2s³) at ½ = 1.5
    expect(r.doc.segments).toHaveLength(2);
    valid(r.doc);
  });

  it('deleting keys merges segments and always keeps one key', () => {
    const doc = { ...curve([k(0, 0), k(1, 1), k(2, 0), k(3, 1)]), segments: [{ kind: 'linear' as const }, { kind: 'step' as const }, { kind: 'hermite' as const }] };
    const d = deleteKeys(doc, [1]);
    expect(d.keys.map((x) => x.time)).toEqual([0, 2, 3]);
    expect(d.segments.map((s) => s.kind)).toEqual(['linear', 'hermite']);
    valid(d);
    const all = deleteKeys(doc, [0, 1, 2, 3]);
    expect(all.keys).toHaveLength(1);
    valid(all);
  });

  it('copies keys relative to the first and pastes them at a time, replacing keys at the same time', () => {
    const doc = curve([k(0, 0), k(1, 1), k(2, 0), k(3, 1)]);
    const clip = copyKeys(doc, [1, 2])!;
    expect(clip.keys.map((x) => x.time)).toEqual([0, 1]);
    const r = pasteKeys(doc, clip, 2.5);
    expect(r.doc.keys.map((x) => x.time)).toEqual([0, 1, 2, 2.5, 3, 3.5]);
    expect(r.indices).toEqual([3, 5]);
    expect(r.doc.keys[3].value).toBe(1);
    valid(r.doc);
    const replaced = pasteKeys(doc, clip, 0);
    expect(replaced.doc.keys.map((x) => [x.time, x.value])).toEqual([[0, 1], [1, 0], [2, 0], [3, 1]]);
    valid(replaced.doc);
  });
});

describe('editor store: undo grouping and drags', () => {
  const doc = curve([k(0, 0), k(1, 1), k(2, 0)]);

  it('one drag with many moves is one undo step, and redo brings the result back', () => {
    const store = createEditorStore(doc);
    const s = () => store.getState();
    s().setSnapping({ frames: false });
    s().select([1]);
    s().beginMove(1, [1]);
    for (let i = 1; i <= 20; i++) s().updateMove(0.01 * i, -0.01 * i);
    s().endDrag();
    expect(s().doc.keys[1].time).toBeCloseTo(1.2, 12);
    expect(store.temporal.getState().pastStates).toHaveLength(1);
    store.temporal.getState().undo();
    expect(s().doc).toBe(doc);
    store.temporal.getState().redo();
    expect(s().doc.keys[1].value).toBeCloseTo(0.8, 12);
  });

  it('selecting, zooming and playing add no undo step', () => {
    const store = createEditorStore(doc);
    store.getState().select([0, 2]);
    store.getState().fit();
    store.getState().setPlayhead(0.5);
    expect(store.temporal.getState().pastStates).toHaveLength(0);
  });

  it('cancel (Escape) returns to the start and records nothing', () => {
    const store = createEditorStore(doc);
    store.getState().beginMove(1, [1]);
    store.getState().updateMove(0.5, 0.5);
    expect(store.getState().doc).not.toBe(doc);
    store.getState().cancelDrag();
    expect(store.getState().doc).toBe(doc);
    expect(store.temporal.getState().pastStates).toHaveLength(0);
    // history tracks again after a cancel
    store.getState().edit((d) => deleteKeys(d, [1]));
    expect(store.temporal.getState().pastStates).toHaveLength(1);
  });

  it('a handle drag is one step and makes the key manual', () => {
    const store = createEditorStore(curve([k(0, 0, 'catmull-rom'), k(1, 1, 'catmull-rom'), k(2, 0, 'catmull-rom')]));
    store.getState().beginHandle(1, 'out');
    store.getState().updateHandle(1.5, 1.5);
    store.getState().updateHandle(1.5, 2);
    store.getState().endDrag();
    expect(store.getState().doc.keys[1]).toMatchObject({ rule: 'manual', slopeOut: 2, slopeIn: 2 });
    expect(store.temporal.getState().pastStates).toHaveLength(1);
  });

  it('commands: shortcuts find their command; undo/redo through Ctrl+Z and Ctrl+Shift+Z; copy then paste at the playhead', () => {
    const store = createEditorStore(doc);
    const ev = (key: string, mods: Partial<{ ctrlKey: boolean; shiftKey: boolean }> = {}) =>
      ({ key, ctrlKey: false, metaKey: false, shiftKey: false, altKey: false, ...mods });
    expect(commandForKey(store, ev('ArrowRight'))).toBeNull(); // nothing selected: not available
    store.getState().select([1]);
    commandForKey(store, ev('ArrowRight'))!.run(store);
    expect(store.getState().doc.keys[1].time).toBeCloseTo(1 + 1 / 30, 12);
    commandForKey(store, ev('ArrowUp'))!.run(store);
    expect(store.getState().doc.keys[1].value).toBeCloseTo(1 + store.getState().valueStep, 12);
    commandForKey(store, ev('z', { ctrlKey: true }))!.run(store);
    expect(store.getState().doc.keys[1].value).toBe(1);
    commandForKey(store, ev('Z', { ctrlKey: true, shiftKey: true }))!.run(store);
    expect(store.getState().doc.keys[1].value).toBeCloseTo(1.01, 12);
    commandById('copy').run(store);
    store.getState().setPlayhead(3);
    commandById('paste').run(store);
    expect(store.getState().doc.keys.map((x) => x.time)).toEqual([0, expect.closeTo(1 + 1 / 30, 12), 2, 3]);
    expect(store.getState().selection).toEqual([3]);
    commandForKey(store, ev('Delete'))!.run(store);
    expect(store.getState().doc.keys).toHaveLength(3);
  });
});
