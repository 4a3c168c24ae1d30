import type { CurveDocument, Key, OutsideRule, Segment, SlopeRule } from '../../../shared/curve';

/** A curve document for tests (the brief's fictional studio naming). */
export function makeDoc(
  keys: Partial<Key>[], segments: Segment[] | Segment['kind'] = 'hermite',
  opts: { before?: OutsideRule; after?: OutsideRule; rule?: SlopeRule } = {},
): CurveDocument {
  const full: Key[] = keys.map((k) => ({
    time: k.time ?? 0,
    value: k.value ?? 0,
    slopeIn: k.slopeIn ?? k.slopeOut ?? 0,
    slopeOut: k.slopeOut ?? k.slopeIn ?? 0,
    rule: k.rule ?? opts.rule ?? 'manual',
    slopes: k.slopes ?? 'joined',
    ...(k.tension !== undefined ? { tension: k.tension } : {}),
  }));
  const segs: Segment[] = typeof segments === 'string'
    ? full.slice(1).map(() => ({ kind: segments }))
    : segments;
  return {
    format: 'tangentry.curve', version: 1, name: 'test curve',
    units: { time: 's', value: 'px' }, before: opts.before ?? 'clamp', after: opts.after ?? 'clamp',
    frameRate: 60, drives: 'position', tags: [], keys: full, segments: segs,
  };
}

/** n + 1 evenly spaced numbers from a to b. */
export function linspace(a: number, b: number, n: number): number[] {
  return Array.from({ length: n + 1 }, (_, i) => a + ((b - a) * i) / n);
}
