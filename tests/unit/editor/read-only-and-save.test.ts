import { describe, expect, it } from 'vitest';
import { commandById, commandForKey } from '../../../src/features/editor/commands/commands';
import { createEditorStore } from '../../../src/features/editor/store/editor-store';
import { EDITOR_EXAMPLES } from '../../../src/features/editor/store/examples';

const panel = EDITOR_EXAMPLES[0].doc;

describe('a read-only editor (a viewer)', () => {
  it('refuses edits and drags, and its editing commands are unavailable', () => {
    const api = createEditorStore(panel, { readOnly: true });
    api.getState().edit((d) => ({ ...d, name: 'changed' }));
    expect(api.getState().doc).toBe(panel);
    api.getState().select([1]);
    api.getState().beginMove(1, [1]);
    expect(api.getState().drag).toBeNull();
    api.getState().beginHandle(1, 'out');
    expect(api.getState().drag).toBeNull();
    for (const id of ['delete', 'add-key', 'nudge-left', 'nudge-up-10']) expect(commandById(id).when(api)).toBe(false);
    // looking around still works
    expect(commandById('fit').when(api)).toBe(true);
  });
});

describe('the save command', () => {
  it('is available only while a saver is registered, on Ctrl+S, and runs it', () => {
    const api = createEditorStore(panel);
    const ctrlS = { key: 's', ctrlKey: true, metaKey: false, shiftKey: false, altKey: false };
    expect(commandForKey(api, ctrlS)).toBeNull();
    let saves = 0;
    api.getState().setSaver(() => { saves++; });
    const c = commandForKey(api, ctrlS);
    expect(c?.id).toBe('save');
    c!.run(api);
    expect(saves).toBe(1);
    api.getState().setSaver(null);
    expect(commandById('save').when(api)).toBe(false);
  });
});
