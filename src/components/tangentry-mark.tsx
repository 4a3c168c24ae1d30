import { useId } from 'react';

/**
 * Tangentry's own mark, drawn like a drafting-table detail: an easing curve between two corner
 * registration ticks, with one key (a filled ink circle ringed in vermilion, as a selected key)
 * and its slope handle (a thin line with hollow squares at both ends) laid along the curve's
 * tangent at that key.
 *
 * Geometry (viewBox 32×32): the curve is the cubic Bézier P0(6,25) P1(14,25) P2(12,7) P3(26,7).
 * At t = ½ the point is (P0 + 3P1 + 3P2 + P3)/8 = (13.75, 16) and the tangent direction is
 * P3 + P2 − P1 − P0 = (18, −36) ∝ (1, −2), so the handle ends sit at (13.75, 16) ± 6·(1, −2)/√5.
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
      {/* registration ticks at the lower-left and upper-right corners */}
      <path
        d="M3 23.5V29h5.5M29 8.5V3h-5.5"
        fill="none"
        className="stroke-grid-major"
        strokeWidth="1.5"
        strokeLinecap="square"
      />
      {/* the curve */}
      <path
        d="M6 25C14 25 12 7 26 7"
        fill="none"
        className="stroke-ink dark:stroke-paper"
        strokeWidth="2.25"
        strokeLinecap="round"
      />
      {/* slope handle along the tangent at t = 1/2 */}
      <path
        d="M11.07 21.37L16.43 10.63"
        fill="none"
        className="stroke-ink dark:stroke-paper"
        strokeWidth="1"
      />
      <rect
        x="9.57"
        y="19.87"
        width="3"
        height="3"
        fill="none"
        className="stroke-ink dark:stroke-paper"
        strokeWidth="1"
      />
      <rect
        x="14.93"
        y="9.13"
        width="3"
        height="3"
        fill="none"
        className="stroke-ink dark:stroke-paper"
        strokeWidth="1"
      />
      {/* the key, selected */}
      <circle cx="13.75" cy="16" r="3.6" fill="none" className="stroke-vermilion" strokeWidth="1.25" />
      <circle cx="13.75" cy="16" r="2" className="fill-ink dark:fill-paper" />
    </svg>
  );
}
