import type { ReactNode } from 'react';

/** A sheet of card stock on the drafting table. */
export function Card({ className = '', children }: { className?: string; children: ReactNode }) {
  return (
    <div
      className={`rounded-md border border-grid-major/70 bg-card shadow-[0_1px_0_rgb(27_42_65/0.06)] dark:border-night-line dark:bg-night-card ${className}`}
    >
      {children}
    </div>
  );
}
