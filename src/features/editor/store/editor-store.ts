/**
 * The editor store: plain TypeScript outside React (zustand 5 vanilla + zundo 2 temporal).
 *
 * It holds the document, the selection, the view, the snapping switches, the key clipboard, the
 * preview's playhead and the running drag. Undo history records the document (and the selection
 * that went with it); a step is saved only when the document object changes, so selecting,
 * zooming or playing never adds a step.
 *
 * All edits go through `edit` (one place). A drag is a small state object: `begin*` snapshots the
 * document and pauses the history; each `update*` recomputes the result from the snapshot and the
 * offset from the start pointer; `endDrag` resumes the history and records exactly one step from the
 * snapshot to the result; `cancelDrag` (Escape) puts the snapshot back and records nothing.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import { temporal, type TemporalState } from 'zundo';
import type { CurveDocument } from '../../../../shared/curve';
import { moveKeys, setSlope, slopeFromHandle, type KeyClip } from './edits';
import { valueStepFor, type Snapping } from './snap';
import { fitView, type View } from './view';

export type Drag =
  | { kind: 'move'; start: CurveDocument; startSelection: number[]; indices: number[]; anchor: number }
  | { kind: 'handle'; start: CurveDocument; startSelection: number[]; index: number; side: 'in' | 'out' };

export interface EditorState {
  doc: CurveDocument;
  /** Selected key indices, ascending. */
  selection: number[];
  /** The key the key card describes (the last one clicked or focused), or null. */
  primary: number | null;
  view: View;
  snapping: Snapping;
  /** One arrow-key nudge and the value-snapping grid (see ./snap). */
  valueStep: number;
  clip: KeyClip | null;
  /** Preview time, seconds. */
  playhead: number;
  playing: boolean;
  /** Profile whose table and envelope are drawn on the canvas, or null. */
  overlay: string | null;
  drag: Drag | null;
  helpOpen: boolean;
  /** A viewer's editor: every edit and drag is refused (the document only changes by `load`). */
  readOnly: boolean;
  /** Saves the document to its source when the page offers an explicit Save (the Save command runs it), else null. */
  saver: (() => void) | null;
}

export interface EditorActions {
  /** Replace the document through a pure edit; one undo step when the document changes. */
  edit(fn: (doc: CurveDocument) => CurveDocument, selection?: number[], primary?: number | null): void;
  /** Load a document (a new history). */
  load(doc: CurveDocument): void;
  select(indices: number[], primary?: number | null): void;
  setView(view: View): void;
  fit(): void;
  setSnapping(s: Partial<Snapping>): void;
  setClip(clip: KeyClip | null): void;
  setPlayhead(t: number): void;
  setPlaying(p: boolean): void;
  setOverlay(name: string | null): void;
  setHelpOpen(open: boolean): void;
  setSaver(saver: (() => void) | null): void;
  beginMove(anchor: number, indices: number[]): void;
  /** Offset of the pointer from where the move began, in curve units. */
  updateMove(dt: number, dv: number): void;
  beginHandle(index: number, side: 'in' | 'out'): void;
  /** Pointer position in curve units. */
  updateHandle(t: number, v: number): void;
  endDrag(): void;
  cancelDrag(): void;
}

export type EditorStore = EditorState & EditorActions;
export type EditorStoreApi = StoreApi<EditorStore> & { temporal: StoreApi<TemporalState<Pick<EditorState, 'doc' | 'selection' | 'primary'>>> };

/** The value step of a document: from its keys' value range. */
export function docValueStep(doc: CurveDocument): number {
  let lo = Infinity, hi = -Infinity;
  for (const k of doc.keys) { lo = Math.min(lo, k.value); hi = Math.max(hi, k.value); }
  return valueStepFor(lo, hi);
}

export function createEditorStore(initial: CurveDocument, options: { readOnly?: boolean } = {}): EditorStoreApi {
  const store = createStore<EditorStore>()(
    temporal(
      (set, get) => {
        const history = () => (store as EditorStoreApi).temporal.getState();
        const sorted = (xs: number[]) => [...new Set(xs)].sort((a, b) => a - b);
        return {
          doc: initial,
          selection: [],
          primary: null,
          view: fitView(initial),
          snapping: { frames: true, values: false },
          valueStep: docValueStep(initial),
          clip: null,
          playhead: initial.keys[0].time,
          playing: false,
          overlay: null,
          drag: null,
          helpOpen: false,
          readOnly: options.readOnly ?? false,
          saver: null,

          edit(fn, selection, primary) {
            const s = get();
            if (s.drag || s.readOnly) return;
            const doc = fn(s.doc);
            if (doc === s.doc && selection === undefined) return;
            const nextSel = selection ? sorted(selection) : s.selection.filter((i) => i < doc.keys.length);
            const nextPrimary = primary !== undefined ? primary : s.primary !== null && s.primary < doc.keys.length ? s.primary : null;
            set({ doc, selection: nextSel, primary: nextPrimary });
          },
          load(doc) {
            history().pause();
            set({ doc, selection: [], primary: null, view: fitView(doc), valueStep: docValueStep(doc), playhead: doc.keys[0].time, drag: null });
            history().clear();
            history().resume();
          },
          select(indices, primary) {
            const sel = sorted(indices.filter((i) => i >= 0 && i < get().doc.keys.length));
            set({ selection: sel, primary: primary !== undefined ? primary : sel.length ? sel[sel.length - 1] : null });
          },
          setView: (view) => set({ view }),
          fit: () => set({ view: fitView(get().doc) }),
          setSnapping: (sn) => set({ snapping: { ...get().snapping, ...sn } }),
          setClip: (clip) => set({ clip }),
          setPlayhead: (playhead) => set({ playhead }),
          setPlaying: (playing) => set({ playing }),
          setOverlay: (overlay) => set({ overlay }),
          setHelpOpen: (helpOpen) => set({ helpOpen }),
          setSaver: (saver) => set({ saver }),

          beginMove(anchor, indices) {
            const s = get();
            if (s.drag || s.readOnly) return;
            history().pause();
            set({ drag: { kind: 'move', start: s.doc, startSelection: s.selection, indices: sorted(indices), anchor } });
          },
          updateMove(dt, dv) {
            const { drag, snapping, valueStep } = get();
            if (drag?.kind !== 'move') return;
            set({ doc: moveKeys(drag.start, drag.indices, drag.anchor, dt, dv, { snapping, valueStep }) });
          },
          beginHandle(index, side) {
            const s = get();
            if (s.drag || s.readOnly) return;
            history().pause();
            set({ drag: { kind: 'handle', start: s.doc, startSelection: s.selection, index, side } });
          },
          updateHandle(t, v) {
            const { drag } = get();
            if (drag?.kind !== 'handle') return;
            const k = drag.start.keys[drag.index];
            set({ doc: setSlope(drag.start, drag.index, drag.side, slopeFromHandle(k, drag.side, t, v)) });
          },
          endDrag() {
            const { drag, doc, selection, primary } = get();
            if (!drag) return;
            // put the snapshot back while paused, then record one step from it to the result
            set({ doc: drag.start, selection: drag.startSelection, drag: null });
            history().resume();
            if (doc !== drag.start) set({ doc, selection, primary });
            else set({ selection, primary });
          },
          cancelDrag() {
            const { drag } = get();
            if (!drag) return;
            set({ doc: drag.start, drag: null });
            history().resume();
          },
        };
      },
      {
        partialize: (s) => ({ doc: s.doc, selection: s.selection, primary: s.primary }),
        equality: (a, b) => a.doc === b.doc,
        limit: 200,
      },
    ),
  ) as EditorStoreApi;
  return store;
}
