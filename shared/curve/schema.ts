import { z } from 'zod';
import type { CurveDocument } from './types';
import { DRIVES, MAX_KEYS, OUTSIDE_RULES, SHAPE_FAMILIES, SLOPE_RULES } from './types';

/**
 * The zod 4 schema of a curve document (see ./types and docs/curve-format.md). Field checks come
 * first (finite numbers — zod 4's z.number() rejects NaN and ±Infinity —, enums, non-empty name);
 * the cross-field limits run in one superRefine (zod 4 runs it too when only non-aborting field
 * checks failed, so both kinds may be reported together):
 *   1 ≤ keys ≤ MAX_KEYS (a single key is a constant); times non-decreasing; at most two keys share
 *   a time (a jump); segments.length === keys.length − 1; a joined manual key has slopeIn ===
 *   slopeOut; a bezier segment carries `bezier` and its handle times lie in [t_i, t_{i+1}];
 *   a shape segment carries `shape`.
 * Each issue's message starts with the field path, e.g. "keys[3].time: …".
 */
const finite = (field: string) =>
  z.number({ error: (iss) => (iss.input === undefined ? `${field} is required` : `${field} must be a finite number`) });

const point = z.strictObject({
  time: finite('time').describe('Seconds on the curve time axis'),
  value: finite('value'),
});

const params = z.strictObject({
  overshoot: finite('overshoot').optional().describe('back: overshoot s (default 1.70158)'),
  amplitude: finite('amplitude').min(1, 'amplitude must be at least 1').optional().describe('elastic: amplitude ≥ 1 (default 1)'),
  period: finite('period').positive('period must be greater than 0').optional().describe('elastic: period (default 0.3)'),
  stiffness: finite('stiffness').positive('stiffness must be greater than 0').optional().describe('spring: stiffness k (default 100)'),
  damping: finite('damping').min(0, 'damping must not be negative').optional().describe('spring: damping c (default 10)'),
  mass: finite('mass').positive('mass must be greater than 0').optional().describe('spring: mass m (default 1)'),
  velocity: finite('velocity').optional().describe('spring: initial velocity, normalised units per second (default 0)'),
});

const shape = z.strictObject({
  family: z.enum(SHAPE_FAMILIES as [string, ...string[]], { error: `family must be one of ${SHAPE_FAMILIES.join(', ')}` }),
  ease: z.enum(['in', 'out', 'in-out'], { error: 'ease must be one of in, out, in-out' }),
  params: params.optional(),
});

const key = z.strictObject({
  time: finite('time').describe('Seconds'),
  value: finite('value'),
  slopeIn: finite('slopeIn').describe('Arriving slope, value units per second'),
  slopeOut: finite('slopeOut').describe('Leaving slope, value units per second'),
  rule: z.enum(SLOPE_RULES as [string, ...string[]], { error: `rule must be one of ${SLOPE_RULES.join(', ')}` }),
  tension: finite('tension').min(0, 'tension must be between 0 and 1').max(1, 'tension must be between 0 and 1')
    .optional().describe('catmull-rom: cardinal tension c in [0, 1] (default 0)'),
  slopes: z.enum(['joined', 'split'], { error: 'slopes must be joined or split' }),
});

const segment = z.strictObject({
  kind: z.enum(['step', 'linear', 'hermite', 'bezier', 'shape'], { error: 'kind must be one of step, linear, hermite, bezier, shape' }),
  bezier: z.strictObject({ h1: point, h2: point }).optional().describe('Required when kind is bezier'),
  shape: shape.optional().describe('Required when kind is shape'),
});

const outside = (field: string) =>
  z.enum(OUTSIDE_RULES as [string, ...string[]], { error: `${field} must be one of ${OUTSIDE_RULES.join(', ')}` });

const base = z.strictObject({
  format: z.literal('tangentry.curve', { error: 'format must be "tangentry.curve"' }),
  version: z.literal(1, { error: 'version must be 1' }),
  name: z.string({ error: 'name must be a string' }).trim().min(1, 'name must not be empty').max(200, 'name must be at most 200 characters'),
  description: z.string({ error: 'description must be a string' }).optional(),
  units: z.strictObject({
    time: z.literal('s', { error: 'units.time must be "s"' }),
    value: z.string({ error: 'units.value must be a string' }),
  }),
  before: outside('before').describe('Outside rule before the first key'),
  after: outside('after').describe('Outside rule after the last key'),
  frameRate: finite('frameRate').positive('frameRate must be greater than 0').describe('Frames per second for snapping'),
  drives: z.enum(DRIVES as [string, ...string[]], { error: `drives must be one of ${DRIVES.join(', ')}` }),
  tags: z.array(z.string({ error: 'a tag must be a string' }), { error: 'tags must be an array of strings' }),
  keys: z.array(key, { error: 'keys must be an array' })
    .min(1, 'keys must hold at least one key')
    .max(MAX_KEYS, `keys must hold at most ${MAX_KEYS} keys`),
  segments: z.array(segment, { error: 'segments must be an array' }),
});

type Ctx = z.core.$RefinementCtx<z.infer<typeof base>>;

function crossChecks(doc: z.infer<typeof base>, ctx: Ctx): void {
  const { keys, segments } = doc;
  const add = (path: (string | number)[], message: string) => ctx.addIssue({ code: 'custom', path, message });
  if (segments.length !== Math.max(0, keys.length - 1)) {
    add(['segments'], `segments must hold keys.length − 1 = ${Math.max(0, keys.length - 1)} entries (got ${segments.length})`);
  }
  for (let i = 0; i < keys.length; i++) {
    const k = keys[i];
    if (i > 0) {
      const prev = keys[i - 1].time;
      if (k.time < prev) add(['keys', i, 'time'], `time must not be before the previous key's time (${k.time} < ${prev})`);
      else if (k.time === prev && i > 1 && keys[i - 2].time === prev) {
        add(['keys', i, 'time'], `time ${k.time} is shared by three keys; a jump uses exactly two keys at one time`);
      }
    }
    if (k.rule === 'manual' && k.slopes === 'joined' && k.slopeIn !== k.slopeOut) {
      add(['keys', i, 'slopeIn'], `a joined manual key needs slopeIn equal to slopeOut (got ${k.slopeIn} and ${k.slopeOut}); use slopes "split" for a slope break`);
    }
  }
  const m = Math.min(segments.length, keys.length - 1);
  for (let i = 0; i < m; i++) {
    const s = segments[i];
    const t0 = keys[i].time;
    const t1 = keys[i + 1].time;
    if (s.kind === 'bezier') {
      if (!s.bezier) add(['segments', i, 'bezier'], 'bezier is required when kind is "bezier"');
      else {
        for (const h of ['h1', 'h2'] as const) {
          const ht = s.bezier[h].time;
          if (ht < t0 || ht > t1) add(['segments', i, 'bezier', h, 'time'], `handle time ${ht} must lie inside its segment [${t0}, ${t1}]`);
        }
      }
    }
    if (s.kind === 'shape' && !s.shape) add(['segments', i, 'shape'], 'shape is required when kind is "shape"');
  }
}

/** The curve document schema (zod 4). */
export const curveDocumentSchema: z.ZodType<CurveDocument> = base.superRefine(crossChecks) as unknown as z.ZodType<CurveDocument>;

/** "keys[3].time" from ['keys', 3, 'time']. */
export function formatPath(path: readonly PropertyKey[]): string {
  let s = '';
  for (const p of path) {
    if (typeof p === 'number') s += `[${p}]`;
    else s += s ? `.${String(p)}` : String(p);
  }
  return s;
}

export interface CurveIssue {
  path: string;
  message: string;
}

/**
 * Validate unknown input (parsed JSON) as a curve document. Either the document (a clean copy,
 * unknown fields rejected) or every issue with its path and a message that names the field.
 */
export function parseCurveDocument(input: unknown):
  { ok: true; doc: CurveDocument } | { ok: false; issues: CurveIssue[] } {
  const r = curveDocumentSchema.safeParse(input);
  if (r.success) return { ok: true, doc: r.data };
  const issues = r.error.issues.map((iss) => {
    const path = formatPath(iss.path);
    let message = iss.message;
    if (iss.code === 'unrecognized_keys') message = `unknown field${iss.keys.length > 1 ? 's' : ''} ${iss.keys.join(', ')}`;
    const where = path || 'document';
    return { path, message: message.startsWith(`${where}:`) ? message : `${where}: ${message}` };
  });
  return { ok: false, issues };
}

/** The JSON Schema (draft 2020-12) of the curve document, from zod 4's z.toJSONSchema. */
export function curveJsonSchema(): object {
  const schema = z.toJSONSchema(base, { target: 'draft-2020-12' }) as Record<string, unknown>;
  return {
    $id: 'https://tangentry.test/schemas/curve.schema.json',
    title: 'Tangentry curve document',
    description:
      'A curve: keys (time in seconds, value, slopes), one segment per key interval, outside rules. ' +
      `Cross-field limits (not expressible here): times non-decreasing, at most two keys per time, ` +
      `segments.length = keys.length − 1, bezier handle times inside their segment, ≤ ${MAX_KEYS} keys.`,
    ...schema,
  };
}
