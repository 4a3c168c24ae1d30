/**
 * Every editor command, defined once: its name, what it does, its keys and when it is available.
 * The toolbar buttons, the keyboard handler and the help sheet all read this list.
 */
import { addKeyAt, copyKeys, deleteKeys, moveKeys, pasteKeys } from '../store/edits';
import type { EditorStoreApi } from '../store/editor-store';
import { snapTime } from '../store/snap';
import { zoomView } from '../store/view';
import { matches, type KeyLike, type Shortcut } from './shortcut';

export type CommandGroup = 'Edit' | 'Keys' | 'View' | 'Preview';

export interface Command {
  id: string;
  label: string;
  group: CommandGroup;
  keys: Shortcut[];
  /** Available now? (buttons are disabled and shortcuts ignored when not) */
  when(api: EditorStoreApi): boolean;
  run(api: EditorStoreApi): void;
}

const hasSelection = (api: EditorStoreApi) => api.getState().selection.length > 0;
/** Edits are refused in a read-only (viewer's) editor. */
const editable = (api: EditorStoreApi) => !api.getState().readOnly;

/** Move the selection by whole frames and value steps (the anchor is the key card's key). */
function nudge(api: EditorStoreApi, frames: number, steps: number): void {
  const s = api.getState();
  const anchor = s.primary ?? s.selection[0];
  s.edit((doc) =>
    moveKeys(doc, s.selection, anchor, frames / doc.frameRate, steps * s.valueStep, { snapping: s.snapping, valueStep: s.valueStep }),
  );
}

function zoomCentre(api: EditorStoreApi, factor: number): void {
  const { view, setView } = api.getState();
  setView(zoomView(view, factor, (view.t0 + view.t1) / 2, (view.v0 + view.v1) / 2));
}

function nudgeCommand(id: string, label: string, key: string, frames: number, steps: number): Command[] {
  return [
    { id, label, group: 'Keys', keys: [{ key }], when: (api) => hasSelection(api) && editable(api), run: (api) => nudge(api, frames, steps) },
    {
      id: `${id}-10`, label: `${label} ×10`, group: 'Keys', keys: [{ key, shift: true }], when: (api) => hasSelection(api) && editable(api),
      run: (api) => nudge(api, frames * 10, steps * 10),
    },
  ];
}

export const COMMANDS: readonly Command[] = [
  {
    // only where the page offers an explicit Save (a library curve the person may edit)
    id: 'save', label: 'Save to the library', group: 'Edit', keys: [{ key: 's', mod: true }],
    when: (api) => api.getState().saver !== null && !api.getState().drag,
    run: (api) => api.getState().saver?.(),
  },
  {
    id: 'undo', label: 'Undo', group: 'Edit', keys: [{ key: 'z', mod: true }],
    when: (api) => api.temporal.getState().pastStates.length > 0 && !api.getState().drag,
    run: (api) => api.temporal.getState().undo(),
  },
  {
    id: 'redo', label: 'Redo', group: 'Edit', keys: [{ key: 'z', mod: true, shift: true }, { key: 'y', mod: true }],
    when: (api) => api.temporal.getState().futureStates.length > 0 && !api.getState().drag,
    run: (api) => api.temporal.getState().redo(),
  },
  {
    id: 'copy', label: 'Copy keys', group: 'Edit', keys: [{ key: 'c', mod: true }], when: hasSelection,
    run: (api) => { const s = api.getState(); s.setClip(copyKeys(s.doc, s.selection)); },
  },
  {
    id: 'paste', label: 'Paste keys at the playhead (its nearest frame when snapping)', group: 'Edit', keys: [{ key: 'v', mod: true }],
    when: (api) => api.getState().clip !== null && editable(api),
    run: (api) => {
      const s = api.getState();
      if (!s.clip) return;
      // at the playhead's nearest frame when frame snapping is on
      const at = s.snapping.frames ? snapTime(s.playhead, s.doc.frameRate) : s.playhead;
      const r = pasteKeys(s.doc, s.clip, at);
      s.edit(() => r.doc, r.indices, r.indices[0] ?? null);
    },
  },
  {
    id: 'delete', label: 'Delete keys', group: 'Edit', keys: [{ key: 'Delete' }, { key: 'Backspace' }],
    when: (api) => hasSelection(api) && editable(api) && api.getState().doc.keys.length > 1,
    run: (api) => { const s = api.getState(); s.edit((d) => deleteKeys(d, s.selection), [], null); },
  },
  {
    id: 'add-key', label: 'Add a key at the playhead', group: 'Keys', keys: [{ key: 'Insert' }],
    when: editable,
    run: (api) => {
      const s = api.getState();
      const r = addKeyAt(s.doc, s.playhead);
      s.edit(() => r.doc, [r.index], r.index);
    },
  },
  {
    id: 'select-all', label: 'Select every key', group: 'Keys', keys: [{ key: 'a', mod: true }], when: () => true,
    run: (api) => { const s = api.getState(); s.select(s.doc.keys.map((_, i) => i)); },
  },
  {
    id: 'select-none', label: 'Clear the selection', group: 'Keys', keys: [{ key: 'Escape' }], when: hasSelection,
    run: (api) => api.getState().select([], null),
  },
  ...nudgeCommand('nudge-left', 'One frame earlier', 'ArrowLeft', -1, 0),
  ...nudgeCommand('nudge-right', 'One frame later', 'ArrowRight', 1, 0),
  ...nudgeCommand('nudge-up', 'One value step up', 'ArrowUp', 0, 1),
  ...nudgeCommand('nudge-down', 'One value step down', 'ArrowDown', 0, -1),
  { id: 'zoom-in', label: 'Zoom in', group: 'View', keys: [{ key: '+' }, { key: '=' }], when: () => true, run: (api) => zoomCentre(api, 1.25) },
  { id: 'zoom-out', label: 'Zoom out', group: 'View', keys: [{ key: '-' }], when: () => true, run: (api) => zoomCentre(api, 1 / 1.25) },
  { id: 'fit', label: 'Fit the curve', group: 'View', keys: [{ key: 'Home' }], when: () => true, run: (api) => api.getState().fit() },
  {
    id: 'snap-frames', label: 'Snap times to frames (on/off)', group: 'View', keys: [{ key: 'f', shift: true }], when: () => true,
    run: (api) => { const s = api.getState(); s.setSnapping({ frames: !s.snapping.frames }); },
  },
  {
    id: 'snap-values', label: 'Snap values to round steps (on/off)', group: 'View', keys: [{ key: 'v', shift: true }], when: () => true,
    run: (api) => { const s = api.getState(); s.setSnapping({ values: !s.snapping.values }); },
  },
  {
    id: 'play', label: 'Play or pause the preview', group: 'Preview', keys: [{ key: 'p' }], when: () => true,
    run: (api) => { const s = api.getState(); s.setPlaying(!s.playing); },
  },
  {
    id: 'help', label: 'Show the shortcuts', group: 'Preview', keys: [{ key: '?' }], when: () => true,
    run: (api) => { const s = api.getState(); s.setHelpOpen(!s.helpOpen); },
  },
];

export function commandById(id: string): Command {
  const c = COMMANDS.find((x) => x.id === id);
  if (!c) throw new Error(`no editor command "${id}"`);
  return c;
}

/** The command a key event asks for, if it is available now. */
export function commandForKey(api: EditorStoreApi, e: KeyLike): Command | null {
  for (const c of COMMANDS) if (c.keys.some((k) => matches(e, k)) && c.when(api)) return c;
  return null;
}
