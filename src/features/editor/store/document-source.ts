/**
 * Where the editor's document comes from and goes to. The scratch editor keeps its document in the
 * browser's local storage; the library (a later issue) will implement the same interface over the
 * server's curve API, with its version as the optimistic-concurrency token.
 */
import { parseCurveDocument, type CurveDocument, type CurveIssue } from '../../../../shared/curve';

export interface LoadedDocument {
  doc: CurveDocument;
  /** Opaque version the next save must name (the server's version, or a local counter). */
  version: number;
}

export type LoadResult =
  | { ok: true; loaded: LoadedDocument | null }
  | { ok: false; message: string; issues?: CurveIssue[] };

export type SaveResult =
  | { ok: true; version: number }
  /** Someone saved since `expectedVersion`: theirs is returned so the editor can offer reload or overwrite. */
  | { ok: false; conflict: LoadedDocument };

export interface EditorDocumentSource {
  /** Short honest label shown above the editor. */
  readonly label: string;
  /** One sentence on where the document lives. */
  readonly description: string;
  load(): Promise<LoadResult>;
  /** Save if the stored version is still `expectedVersion` (null: nothing stored yet). */
  save(doc: CurveDocument, expectedVersion: number | null): Promise<SaveResult>;
  /** Save whatever is stored now (after the animator chose to overwrite a conflict). */
  overwrite(doc: CurveDocument): Promise<{ version: number }>;
}

/** The part of the Web Storage API this source uses (localStorage in the browser). */
export interface KeyValueStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
}

export const SCRATCH_STORAGE_KEY = 'tangentry.editor.scratch.v1';

interface Stored {
  version: number;
  doc: unknown;
}

function readStored(storage: KeyValueStorage, key: string): Stored | null | 'corrupt' {
  const raw = storage.getItem(key);
  if (raw === null) return null;
  try {
    const v = JSON.parse(raw) as Stored;
    if (typeof v !== 'object' || v === null || typeof v.version !== 'number') return 'corrupt';
    return v;
  } catch {
    return 'corrupt';
  }
}

/**
 * The scratch curve in local storage: `{ version, doc }` under one key. Versions count saves, so a
 * second tab that saved in between is a conflict like a stale save to the server would be.
 */
export function localDocumentSource(storage: KeyValueStorage, key = SCRATCH_STORAGE_KEY): EditorDocumentSource {
  const write = (doc: CurveDocument, version: number) => storage.setItem(key, JSON.stringify({ version, doc }));
  return {
    label: 'Scratch curve',
    description: 'Not saved to the library yet; kept in this browser.',
    async load() {
      const s = readStored(storage, key);
      if (s === null) return { ok: true, loaded: null };
      if (s === 'corrupt') return { ok: false, message: 'The scratch curve in this browser is not readable JSON.' };
      const r = parseCurveDocument(s.doc);
      if (!r.ok) return { ok: false, message: 'The scratch curve in this browser is not a valid curve document.', issues: r.issues };
      return { ok: true, loaded: { doc: r.doc, version: s.version } };
    },
    async save(doc, expectedVersion) {
      const s = readStored(storage, key);
      const current = s === null || s === 'corrupt' ? null : s.version;
      if (current !== expectedVersion && s !== null && s !== 'corrupt') {
        const r = parseCurveDocument(s.doc);
        if (r.ok) return { ok: false, conflict: { doc: r.doc, version: s.version } };
      }
      const version = (current ?? 0) + 1;
      write(doc, version);
      return { ok: true, version };
    },
    async overwrite(doc) {
      const s = readStored(storage, key);
      const version = (s === null || s === 'corrupt' ? 0 : s.version) + 1;
      write(doc, version);
      return { version };
    },
  };
}
