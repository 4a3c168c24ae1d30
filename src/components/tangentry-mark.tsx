import { useId } from 'react';

/**
 * Tangentry's own mark, drawn like a drafting-table detail: an easing curve between two corner
 * registration ticks. Its first key is selected (a filled ink circle ringed in vermilion) and shows
 * its out-slope handle (a thin line ending in a hollow square); the last key is a plain ink dot.
 *
 * Geometry (viewBox 32×32): the curve is the cubic Bézier P0(6,24) P1(17,24) P2(15,8) P3(26,8).
 * The handle runs from P0 to P1, which is the curve's tangent at P0 (B'(0) = 3(P1 − P0)), so the
 * curve leaves the key along the handle and then bends away from it.
 * The same drawing is inlined as the favicon in index.html.
 */
export function TangentryMark({
  title = 'Tangentry mark',
  className,
}: {
  /** Accessible name; pass null when a neighbouring text already names it. */
  title?: string | null;
  className?: string;
}) {
  const titleId = useId();
  const labelled = title !== null;
  return (
    <svg
      viewBox="0 0 32 32"
      width="32"
      height="32"
      className={className}
      {...(labelled ? { role: 'img', 'aria-labelledby': titleId } : { 'aria-hidden': true })}
      focusable="false"
    >
      {labelled && <title id={titleId}>{title}</title>}
      {/* registration ticks at the upper-left and lower-right corners */}
      <path
        d="M3 9V3h6M29 23v6h-6"
        fill="none"
        className="stroke-grid-major"
        strokeWidth="1.5"
      />
      {/* the curve */}
      <path
        d="M6 24C17 24 15 8 26 8"
        fill="none"
        className="stroke-ink dark:stroke-paper"
        strokeWidth="2.25"
        strokeLinecap="round"
      />
      {/* out-slope handle of the first key: P0 → P1 */}
      <path d="M6 24H15.25" fill="none" className="stroke-ink dark:stroke-paper" strokeWidth="1.25" />
      <rect
        x="15.25"
        y="22.25"
        width="3.5"
        height="3.5"
        fill="none"
        className="stroke-ink dark:stroke-paper"
        strokeWidth="1.25"
      />
      {/* the last key */}
      <circle cx="26" cy="8" r="1.9" className="fill-ink dark:fill-paper" />
      {/* the first key, selected */}
      <circle cx="6" cy="24" r="3.9" fill="none" className="stroke-vermilion" strokeWidth="1.4" />
      <circle cx="6" cy="24" r="2.1" className="fill-ink dark:fill-paper" />
    </svg>
  );
}
