import { useMemo } from 'react';
import type { CurveDocument } from '../../../../shared/curve';
import { sparklinePath } from './sparkline-path';

/** A small drawing of the curve over its domain (ink on a faint grid line), with its value range for screen readers. */
export function Sparkline({ doc, className = '' }: { doc: CurveDocument; className?: string }) {
  const s = useMemo(() => sparklinePath(doc), [doc]);
  const unit = doc.units.value;
  return (
    <svg viewBox="0 0 120 36" role="img" aria-label={`${doc.name}: from ${doc.keys[0]!.value} to ${doc.keys[doc.keys.length - 1]!.value} ${unit}, range ${s.min.toPrecision(3)} to ${s.max.toPrecision(3)}`} className={`h-12 w-full ${className}`} preserveAspectRatio="none">
      <line x1="0" x2="120" y1="18" y2="18" className="stroke-grid-minor dark:stroke-night-line" strokeWidth="0.5" />
      <path d={s.d} fill="none" className="stroke-ink dark:stroke-paper" strokeWidth="1.4" strokeLinejoin="round" vectorEffect="non-scaling-stroke" />
    </svg>
  );
}
