/**
 * React access to the editor store: components subscribe to the one value they show
 * (useEditor(s => s.view)), so a drag re-renders only what the drag changes.
 */
import { createContext, useContext, type ReactNode } from 'react';
import { useStore } from 'zustand';
import type { EditorState, EditorStore, EditorStoreApi } from './editor-store';

const EditorContext = createContext<EditorStoreApi | null>(null);

export function EditorProvider({ store, children }: { store: EditorStoreApi; children: ReactNode }) {
  return <EditorContext.Provider value={store}>{children}</EditorContext.Provider>;
}

export function useEditorApi(): EditorStoreApi {
  const api = useContext(EditorContext);
  if (!api) throw new Error('useEditorApi: no EditorProvider above this component');
  return api;
}

export function useEditor<T>(selector: (s: EditorStore) => T): T {
  return useStore(useEditorApi(), selector);
}

/** Undo and redo availability (from the zundo history). */
export function useHistoryCounts(): { past: number; future: number } {
  const api = useEditorApi();
  const past = useStore(api.temporal, (t) => t.pastStates.length);
  const future = useStore(api.temporal, (t) => t.futureStates.length);
  return { past, future };
}

export type { EditorState };
