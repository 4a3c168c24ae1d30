/**
 * Keeps every target's bake up to date with the document, without ever queueing stale work:
 * one Web Worker per profile; each has at most one bake in flight and one waiting document (the
 * newest — older waiting ones are dropped). Results land in a small zustand store the strip and the
 * canvas overlay read. Without Worker support (tests in jsdom) bakes run on the main thread.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import type { Profile } from '../../../../shared/bake';
import type { CurveDocument } from '../../../../shared/curve';
import { bakeForStrip, type StripResult } from './bake-strip';

export interface BakeState {
  results: Record<string, StripResult | undefined>;
  /** Profiles whose shown result is older than the document. */
  stale: Record<string, boolean>;
}

export interface BakeRunner {
  store: StoreApi<BakeState>;
  submit(doc: CurveDocument): void;
  dispose(): void;
}

interface Lane {
  profile: Profile;
  worker: Worker | null;
  busy: boolean;
  waiting: CurveDocument | null;
  seq: number;
}

export function createBakeRunner(profiles: readonly Profile[]): BakeRunner {
  const store = createStore<BakeState>()(() => ({ results: {}, stale: {} }));
  const put = (name: string, result: StripResult | undefined, stale: boolean) =>
    store.setState((s) => ({
      results: result ? { ...s.results, [name]: result } : s.results,
      stale: { ...s.stale, [name]: stale },
    }));

  const lanes: Lane[] = profiles.map((profile) => {
    let worker: Worker | null = null;
    if (typeof Worker !== 'undefined') {
      try {
        worker = new Worker(new URL('./bake.worker.ts', import.meta.url), { type: 'module', name: `bake-${profile.name}` });
      } catch {
        worker = null;
      }
    }
    return { profile, worker, busy: false, waiting: null, seq: 0 };
  });

  function start(lane: Lane, doc: CurveDocument) {
    lane.busy = true;
    lane.seq++;
    put(lane.profile.name, undefined, true);
    if (lane.worker) {
      lane.worker.postMessage({ seq: lane.seq, doc, profile: lane.profile });
      return;
    }
    // main-thread fallback, still one frame later so a drag's events are not held up
    setTimeout(() => finish(lane, bakeForStrip(doc, lane.profile)), 0);
  }

  function finish(lane: Lane, result: StripResult) {
    lane.busy = false;
    const next = lane.waiting;
    lane.waiting = null;
    put(lane.profile.name, result, next !== null);
    if (next) start(lane, next);
  }

  for (const lane of lanes) {
    if (!lane.worker) continue;
    lane.worker.onmessage = (e: MessageEvent<{ seq: number; result: StripResult }>) => finish(lane, e.data.result);
    lane.worker.onerror = (e) => {
      e.preventDefault();
      finish(lane, { ok: false, profile: lane.profile.name, error: `the bake worker failed: ${e.message || 'unknown error'}`, verdict: 'over', ms: 0 });
    };
  }

  return {
    store,
    submit(doc) {
      for (const lane of lanes) {
        if (lane.busy) {
          lane.waiting = doc;
          put(lane.profile.name, undefined, true);
        } else start(lane, doc);
      }
    },
    dispose() {
      for (const lane of lanes) lane.worker?.terminate();
    },
  };
}
