import type { Profile } from '../../../../shared/bake/profile';

/** Errors and tolerances in scientific notation with 3 significant figures (the brief's number style). */
export const sci = (v: number) => v.toExponential(2);

export function toleranceText(p: Profile): string {
  return p.tolerance.mode === 'absolute' ? `${sci(p.tolerance.value)} abs` : `${sci(p.tolerance.value)} × range`;
}

export function sampleCountText(p: Profile): string {
  const r = p.sampleCount;
  if (r.rule === 'any') return 'any';
  if (r.rule === 'power-of-two') return 'power of two';
  return r.frameRate ? `frame-aligned @ ${r.frameRate} fps` : 'frame-aligned (curve fps)';
}

export const KERNEL_HELP = { linear: 'values; lerp at runtime', hermite: 'value and slope per entry' } as const;
export const LAYOUT_HELP = { uniform: 'equal spacing, O(1) lookup', adaptive: 'knots where the curve needs them, times stored' } as const;
export const ENCODING_HELP = {
  f32: 'IEEE 754 binary32',
  f16: 'IEEE 754 binary16',
  unorm16: '16-bit, per-curve offset and scale',
  unorm8: '8-bit, per-curve offset and scale',
} as const;
