/**
 * Keeps every target's bake up to date with the document without queueing stale work.
 *
 * A small pool of Web Workers (one fewer than the machine's cores, at least one, at most one per
 * target) serves the targets in turn: each target holds at most its newest waiting document — an
 * older waiting one is dropped — and a free worker takes the target that has waited longest. The
 * main thread keeps a core for the drag. Results land in a small zustand store the strip and the
 * canvas overlay read. Without Worker support (jsdom) bakes run on the main thread, one per task.
 *
 * While a drag runs, a target whose last bake took longer than LIVE_BAKE_MS is held until the drag
 * ends: on a machine with few cores a bake that takes seconds (a long curve on a uniform target)
 * would otherwise take the drag's processor time and still be stale when it lands. The strip says so.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import type { Profile } from '../../../../shared/bake';
import type { CurveDocument } from '../../../../shared/curve';
import { bakeForStrip, type StripResult } from './bake-strip';

/** A target whose last bake took longer than this (ms) waits for the end of a drag. */
export const LIVE_BAKE_MS = 100;

export interface BakeState {
  results: Record<string, StripResult | undefined>;
  /** Profiles whose shown result is older than the document. */
  stale: Record<string, boolean>;
  /** Profiles held until the drag ends (their last bake was slow). */
  held: Record<string, boolean>;
}

export interface BakeRunner {
  store: StoreApi<BakeState>;
  /** Newest document; `dragging` holds the slow targets until a submit with dragging false. */
  submit(doc: CurveDocument, dragging?: boolean): void;
  dispose(): void;
}

interface Lane {
  profile: Profile;
  waiting: CurveDocument | null;
  /** Order in which lanes asked for work (lower first). */
  since: number;
  inFlight: boolean;
  /** Milliseconds the last bake took. */
  lastMs: number;
}

interface Slot {
  worker: Worker | null;
  lane: Lane | null;
}

/** Pool size: cores − 1, at least 1, at most `targets`. */
export function poolSize(cores: number | undefined, targets: number): number {
  return Math.max(1, Math.min(targets, (cores ?? 2) - 1));
}

export function createBakeRunner(profiles: readonly Profile[]): BakeRunner {
  const store = createStore<BakeState>()(() => ({ results: {}, stale: {}, held: {} }));
  let dragging = false;
  const isHeld = (l: Lane) => dragging && l.lastMs > LIVE_BAKE_MS;
  const mark = (name: string, stale: boolean, result?: StripResult) =>
    store.setState((s) => ({
      results: result ? { ...s.results, [name]: result } : s.results,
      stale: s.stale[name] === stale && !result ? s.stale : { ...s.stale, [name]: stale },
    }));

  let clock = 0;
  const lanes: Lane[] = profiles.map((profile) => ({ profile, waiting: null, since: 0, inFlight: false, lastMs: 0 }));
  const canWork = typeof Worker !== 'undefined';
  const size = canWork ? poolSize(typeof navigator !== 'undefined' ? navigator.hardwareConcurrency : undefined, profiles.length) : 1;
  const slots: Slot[] = [];
  for (let k = 0; k < size; k++) {
    let worker: Worker | null = null;
    if (canWork) {
      try {
        worker = new Worker(new URL('./bake.worker.ts', import.meta.url), { type: 'module', name: `bake-${k}` });
      } catch {
        worker = null;
      }
    }
    const slot: Slot = { worker, lane: null };
    if (worker) {
      worker.onmessage = (e: MessageEvent<{ result: StripResult }>) => done(slot, e.data.result);
      worker.onerror = (e) => {
        e.preventDefault();
        const name = slot.lane?.profile.name ?? '?';
        done(slot, { ok: false, profile: name, error: `the bake worker failed: ${e.message || 'unknown error'}`, verdict: 'over', ms: 0 });
      };
    }
    slots.push(slot);
  }

  function pump() {
    for (const slot of slots) {
      if (slot.lane) continue;
      let next: Lane | null = null;
      for (const l of lanes) if (l.waiting && !l.inFlight && !isHeld(l) && (!next || l.since < next.since)) next = l;
      if (!next) return;
      const doc = next.waiting!;
      next.waiting = null;
      next.inFlight = true;
      slot.lane = next;
      if (slot.worker) slot.worker.postMessage({ seq: 0, doc, profile: next.profile });
      else {
        const lane = next;
        setTimeout(() => done(slot, bakeForStrip(doc, lane.profile)), 0);
      }
    }
  }

  function done(slot: Slot, result: StripResult) {
    const lane = slot.lane;
    slot.lane = null;
    if (!lane) return;
    lane.inFlight = false;
    lane.lastMs = result.ms;
    mark(lane.profile.name, lane.waiting !== null, result);
    pump();
  }

  return {
    store,
    submit(doc, drag = false) {
      dragging = drag;
      for (const l of lanes) {
        if (!l.waiting) l.since = ++clock;
        l.waiting = doc;
        mark(l.profile.name, true);
      }
      const held: Record<string, boolean> = {};
      for (const l of lanes) held[l.profile.name] = isHeld(l);
      const before = store.getState().held;
      if (lanes.some((l) => before[l.profile.name] !== held[l.profile.name])) store.setState({ held });
      pump();
    },
    dispose() {
      for (const s of slots) s.worker?.terminate();
    },
  };
}
