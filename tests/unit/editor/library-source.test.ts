import { describe, expect, it } from 'vitest';
import type { CurveDocument } from '../../../shared/curve';
import type { CurveDto } from '../../../shared/schemas/packs';
import { ApiError, type ApiRequestOptions } from '../../../src/lib/api-client';
import { curveDrafts, curvePath, draftKey, librarySource, type ApiRequest, type DraftStorage } from '../../../src/features/editor/library-source';
import { EDITOR_EXAMPLES } from '../../../src/features/editor/store/examples';

const panel = EDITOR_EXAMPLES[0].doc;
const ref = { teamId: 't-1', pack: 'menu-transitions', curveId: '3f1c0d5e-0000-4000-8000-000000000001' };

/**
 * A stand-in for the packs API's curve routes with the server's rule (server/packs/packs.service.ts
 * replaceCurve): a PUT naming the stored revision stores the document as revision + 1; any other
 * revision is HTTP 409 revision_conflict. Records every request.
 */
function fakeCurveApi(initial: CurveDocument) {
  const state = { doc: initial, revision: 1, calls: [] as { method: string; path: string; body?: unknown }[] };
  const dto = (): CurveDto => ({ id: ref.curveId, packId: 'p', name: state.doc.name, document: state.doc, position: 0, revision: state.revision, updatedAt: '2026-01-01T00:00:00Z' });
  const request = (async (path: string, o: ApiRequestOptions = {}) => {
    const method = o.method ?? 'GET';
    state.calls.push({ method, path, body: o.body });
    if (path !== curvePath(ref)) throw new ApiError({ status: 404, code: 'not_found', message: 'no such curve' });
    if (method === 'GET') return { curve: dto() };
    if (method === 'PUT') {
      const b = o.body as { document: CurveDocument; revision: number };
      if (b.revision !== state.revision) {
        throw new ApiError({ status: 409, code: 'revision_conflict', message: `you had revision ${b.revision}, it is now ${state.revision}` });
      }
      state.doc = b.document;
      state.revision += 1;
      return { curve: dto() };
    }
    throw new Error(`unexpected ${method}`);
  }) as ApiRequest;
  return { state, request };
}

describe('library document source', () => {
  it('loads the stored curve with its revision as the version', async () => {
    const api = fakeCurveApi(panel);
    const r = await librarySource(ref, api.request).load();
    expect(r).toEqual({ ok: true, loaded: { doc: panel, version: 1 } });
    expect(api.state.calls).toEqual([{ method: 'GET', path: `/api/teams/t-1/packs/menu-transitions/curves/${ref.curveId}`, body: undefined }]);
  });

  it('a save naming the loaded revision is stored and returns the next revision', async () => {
    const api = fakeCurveApi(panel);
    const src = librarySource(ref, api.request);
    const mine = { ...panel, name: 'mine' };
    expect(await src.save(mine, 1)).toEqual({ ok: true, version: 2 });
    expect(api.state.calls.at(-1)).toEqual({ method: 'PUT', path: curvePath(ref), body: { document: mine, revision: 1 } });
    expect(api.state.doc).toEqual(mine);
  });

  it('409 revision_conflict becomes a conflict carrying the stored curve and its revision', async () => {
    const api = fakeCurveApi(panel);
    const a = librarySource(ref, api.request);
    const b = librarySource(ref, api.request);
    const theirs = { ...panel, name: 'theirs' };
    expect(await b.save(theirs, 1)).toEqual({ ok: true, version: 2 });
    const stale = await a.save({ ...panel, name: 'mine' }, 1);
    expect(stale).toEqual({ ok: false, conflict: { doc: theirs, version: 2 } });
    // nothing of the stale save was stored
    expect(api.state.doc).toEqual(theirs);
    // Overwrite reads the current revision and saves over it
    expect(await a.overwrite({ ...panel, name: 'mine' })).toEqual({ version: 3 });
    expect(api.state.doc.name).toBe('mine');
  });

  it('other failures are not conflicts: a 400 is thrown with the server message, a 404 load is explained', async () => {
    const api = fakeCurveApi(panel);
    const bad = (async (path: string, o: ApiRequestOptions = {}) => {
      if (o.method === 'PUT') throw new ApiError({ status: 400, code: 'invalid_document', message: 'document.keys[1].time: must be after key 1' });
      return api.request(path, o);
    }) as ApiRequest;
    await expect(librarySource(ref, bad).save(panel, 1)).rejects.toThrow('document.keys[1].time: must be after key 1');
    const missing = await librarySource({ ...ref, curveId: 'gone' }, api.request).load();
    expect(missing.ok).toBe(false);
    expect(!missing.ok && missing.message).toMatch(/no such curve in pack "menu-transitions"/);
  });

  it('a save with no loaded revision is refused before any request', async () => {
    const api = fakeCurveApi(panel);
    await expect(librarySource(ref, api.request).save(panel, null)).rejects.toThrow(/no revision/);
    expect(api.state.calls).toEqual([]);
  });
});

describe('curve drafts in local storage', () => {
  function memoryStorage(): DraftStorage & { map: Map<string, string> } {
    const map = new Map<string, string>();
    return { map, getItem: (k) => map.get(k) ?? null, setItem: (k, v) => void map.set(k, v), removeItem: (k) => void map.delete(k) };
  }

  it('are keyed by curve id and revision: a draft of revision 1 is not read at revision 2', () => {
    const storage = memoryStorage();
    const drafts = curveDrafts(storage, ref.curveId);
    const edited = { ...panel, name: 'draft' };
    drafts.write(1, edited);
    expect([...storage.map.keys()]).toEqual([draftKey(ref.curveId, 1)]);
    expect(drafts.read(1)).toEqual(edited);
    expect(drafts.read(2)).toBeNull();
    expect(curveDrafts(storage, 'another-curve').read(1)).toBeNull();
    drafts.clear(1);
    expect(drafts.read(1)).toBeNull();
  });

  it('a stored draft that is not a valid curve document is ignored', () => {
    const storage = memoryStorage();
    storage.setItem(draftKey(ref.curveId, 1), '{"keys": []}');
    storage.setItem(draftKey(ref.curveId, 2), 'not json');
    const drafts = curveDrafts(storage, ref.curveId);
    expect(drafts.read(1)).toBeNull();
    expect(drafts.read(2)).toBeNull();
  });
});
