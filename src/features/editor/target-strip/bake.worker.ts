/// <reference lib="webworker" />
/**
 * Bakes off the main thread. Message in: { seq, doc, profile }; out: { seq, result }.
 * The runner (./bake-runner.ts) sends a new job only when this worker has answered the last one.
 */
import type { Profile } from '../../../../shared/bake';
import type { CurveDocument } from '../../../../shared/curve';
import { bakeForStrip } from './bake-strip';

declare const self: DedicatedWorkerGlobalScope;

self.onmessage = (e: MessageEvent<{ seq: number; doc: CurveDocument; profile: Profile }>) => {
  const { seq, doc, profile } = e.data;
  const result = bakeForStrip(doc, profile);
  const transfer = result.ok ? [result.dotTimes.buffer, result.dotValues.buffer] : [];
  self.postMessage({ seq, result }, transfer);
};
