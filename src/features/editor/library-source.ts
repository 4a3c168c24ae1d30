/**
 * A library curve as an EditorDocumentSource: loaded from and saved to the packs API, with the
 * curve's `revision` as the optimistic-concurrency token.
 *
 *   GET …/packs/:pack/curves/:id                  → { curve }           (load)
 *   PUT …/packs/:pack/curves/:id { document, revision } → { curve }     (save)
 *       409 revision_conflict                     → the stored curve is read again and returned as
 *                                                    the conflict, so the editor can offer Reload or Overwrite
 *
 * Plus the browser-local draft of unsaved edits, keyed by curve id and the revision they start from,
 * so a reload keeps them and a draft made on an older revision is never laid over a newer one.
 */
import { parseCurveDocument, type CurveDocument } from '../../../shared/curve';
import type { CurveDto } from '../../../shared/schemas/packs';
import { apiRequest, isApiError, type ApiRequestOptions } from '../../lib/api-client';
import type { EditorDocumentSource, KeyValueStorage, LoadedDocument, LoadResult } from './store/document-source';

/** The shape of src/lib/api-client's apiRequest (tests pass their own). */
export type ApiRequest = <T>(path: string, options?: ApiRequestOptions) => Promise<T>;

export interface LibraryCurveRef {
  teamId: string;
  pack: string;
  curveId: string;
}

/** How many times Overwrite re-reads the revision when someone saves between its read and its write. */
const OVERWRITE_ATTEMPTS = 3;

export function curvePath({ teamId, pack, curveId }: LibraryCurveRef): string {
  return `/api/teams/${encodeURIComponent(teamId)}/packs/${encodeURIComponent(pack)}/curves/${encodeURIComponent(curveId)}`;
}

const isConflict = (e: unknown) => isApiError(e) && e.status === 409 && e.code === 'revision_conflict';

function toLoaded(curve: CurveDto): LoadedDocument {
  const r = parseCurveDocument(curve.document);
  if (!r.ok) throw new Error(`The stored curve "${curve.name}" is not a valid curve document (${r.issues[0]?.message ?? 'no detail'}).`);
  return { doc: r.doc, version: curve.revision };
}

export function librarySource(ref: LibraryCurveRef, request: ApiRequest = apiRequest): EditorDocumentSource {
  const path = curvePath(ref);
  const read = async () => toLoaded((await request<{ curve: CurveDto }>(path)).curve);
  const put = async (doc: CurveDocument, revision: number) =>
    (await request<{ curve: CurveDto }>(path, { method: 'PUT', body: { document: doc, revision } })).curve.revision;
  return {
    label: 'Library curve',
    description: `In pack ${ref.pack}; saved to the library when you press Save.`,
    async load(): Promise<LoadResult> {
      try {
        return { ok: true, loaded: await read() };
      } catch (e) {
        if (isApiError(e) && e.status === 404) return { ok: false, message: `There is no such curve in pack "${ref.pack}" (it may have been moved or removed).` };
        return { ok: false, message: (e as Error).message };
      }
    },
    async save(doc, expectedVersion) {
      if (expectedVersion === null) throw new Error('This curve was not loaded from the library, so there is no revision to save over.');
      try {
        return { ok: true, version: await put(doc, expectedVersion) };
      } catch (e) {
        if (!isConflict(e)) throw e;
        return { ok: false, conflict: await read() };
      }
    },
    async overwrite(doc) {
      let last: unknown;
      for (let i = 0; i < OVERWRITE_ATTEMPTS; i++) {
        const { version } = await read();
        try {
          return { version: await put(doc, version) };
        } catch (e) {
          if (!isConflict(e)) throw e;
          last = e;
        }
      }
      throw last;
    },
  };
}

/** Web Storage with removal (localStorage in the browser). */
export interface DraftStorage extends KeyValueStorage {
  removeItem(key: string): void;
}

export interface CurveDrafts {
  /** The unsaved document begun from `revision`, if one is kept and still a valid curve. */
  read(revision: number): CurveDocument | null;
  write(revision: number, doc: CurveDocument): void;
  clear(revision: number): void;
}

export const draftKey = (curveId: string, revision: number) => `tangentry.editor.draft.v1.${curveId}.r${revision}`;

export function curveDrafts(storage: DraftStorage, curveId: string): CurveDrafts {
  return {
    read(revision) {
      const raw = storage.getItem(draftKey(curveId, revision));
      if (raw === null) return null;
      try {
        const r = parseCurveDocument(JSON.parse(raw));
        return r.ok ? r.doc : null;
      } catch {
        return null;
      }
    },
    write(revision, doc) {
      try {
        storage.setItem(draftKey(curveId, revision), JSON.stringify(doc));
      } catch {
        // storage full or refused: the edit is still in the page, only the reload safety net is lost
      }
    },
    clear(revision) {
      storage.removeItem(draftKey(curveId, revision));
    },
  };
}
