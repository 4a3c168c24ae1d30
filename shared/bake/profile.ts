/**
 * Target profiles: how one platform wants its tables. Validated with zod 4; every message names
 * its field. Storage and the profiles page are built on this schema elsewhere.
 */
import { z } from 'zod';

export const KERNELS = ['linear', 'hermite'] as const;
export const LAYOUTS = ['uniform', 'adaptive'] as const;
export const ENCODINGS = ['f32', 'f16', 'unorm16', 'unorm8'] as const;
export const OUTPUT_HINTS = ['table', 'css'] as const;

export type Kernel = (typeof KERNELS)[number];
export type Layout = (typeof LAYOUTS)[number];
export type Encoding = (typeof ENCODINGS)[number];

/** zod 4 error map for strict objects: names the unknown keys. */
const objectError = (field: string) => (iss: { code?: string; keys?: string[] }) =>
  iss.code === 'unrecognized_keys' && iss.keys
    ? `${field}: unknown field ${iss.keys.map((k) => `"${k}"`).join(', ')}`
    : `${field}: must be an object`;

const positiveFinite = (field: string) =>
  z
    .number({ error: `${field}: must be a number` })
    .refine(Number.isFinite, { error: `${field}: must be finite` })
    .refine((v) => v > 0, { error: `${field}: must be greater than 0` });

export const SampleCountRuleSchema = z.discriminatedUnion(
  'rule',
  [
    z.strictObject({ rule: z.literal('any') }, { error: objectError('sampleCount') }),
    z.strictObject({ rule: z.literal('power-of-two') }, { error: objectError('sampleCount') }),
    z.strictObject(
      {
        rule: z.literal('frame-aligned'),
        /** Frames per second; when absent the curve's own frame rate is used. */
        frameRate: positiveFinite('sampleCount.frameRate').optional(),
      },
      { error: objectError('sampleCount') },
    ),
  ],
  { error: 'sampleCount.rule: must be any, power-of-two or frame-aligned' },
);

export const ProfileSchema = z.strictObject(
  {
    name: z
      .string({ error: 'name: must be a string' })
      .trim()
      .min(1, { error: 'name: must not be empty' })
      .max(80, { error: 'name: at most 80 characters' }),
    tolerance: z.strictObject(
      {
        mode: z.enum(['absolute', 'relative'], { error: 'tolerance.mode: must be absolute or relative' }),
        value: positiveFinite('tolerance.value'),
      },
      { error: objectError('tolerance') },
    ),
    kernel: z.enum(KERNELS, { error: 'kernel: must be linear or hermite' }),
    layout: z.enum(LAYOUTS, { error: 'layout: must be uniform or adaptive' }),
    encoding: z.enum(ENCODINGS, { error: 'encoding: must be f32, f16, unorm16 or unorm8' }),
    byteCap: z
      .number({ error: 'byteCap: must be a number of bytes' })
      .int({ error: 'byteCap: must be a whole number of bytes' })
      .positive({ error: 'byteCap: must be greater than 0' })
      .optional(),
    sampleCount: SampleCountRuleSchema.default({ rule: 'any' }),
    output: z.enum(OUTPUT_HINTS, { error: 'output: must be table or css' }).default('table'),
  },
  { error: objectError('profile') },
);

export type Profile = z.output<typeof ProfileSchema>;
export type ProfileInput = z.input<typeof ProfileSchema>;
export type SampleCountRule = z.output<typeof SampleCountRuleSchema>;

export type ProfileParse = { ok: true; profile: Profile } | { ok: false; issues: { path: string; message: string }[] };

/** Validate a profile; issues carry a dotted path and a message that names the field. */
export function parseProfile(input: unknown): ProfileParse {
  const r = ProfileSchema.safeParse(input);
  if (r.success) {
    if (r.data.output === 'css' && r.data.kernel !== 'linear') {
      return { ok: false, issues: [{ path: 'kernel', message: 'kernel: CSS linear() output needs the linear kernel' }] };
    }
    return { ok: true, profile: r.data };
  }
  return {
    ok: false,
    issues: r.error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message })),
  };
}

/** The demo studio's four targets (BRIEF.md, "Demo scenario"). */
export const DEMO_PROFILES: readonly Profile[] = [
  {
    name: 'Console', tolerance: { mode: 'absolute', value: 5e-4 }, kernel: 'hermite', layout: 'adaptive',
    encoding: 'f32', sampleCount: { rule: 'any' }, output: 'table',
  },
  {
    name: 'Handheld', tolerance: { mode: 'absolute', value: 2e-3 }, kernel: 'hermite', layout: 'uniform',
    encoding: 'unorm16', sampleCount: { rule: 'any' }, output: 'table',
  },
  {
    name: 'Mobile', tolerance: { mode: 'absolute', value: 4e-3 }, kernel: 'linear', layout: 'uniform',
    encoding: 'unorm8', sampleCount: { rule: 'any' }, output: 'table',
  },
  {
    name: 'Web', tolerance: { mode: 'absolute', value: 3e-3 }, kernel: 'linear', layout: 'adaptive',
    encoding: 'f32', sampleCount: { rule: 'any' }, output: 'css',
  },
];
