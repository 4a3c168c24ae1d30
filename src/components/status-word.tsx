import type { ReactNode } from 'react';

/**
 * Pass / near / over, the three verdict colours of the brief, plus a neutral one for "not known yet".
 * Always rendered as a shape and a word: colour is never the only signal.
 */
export type StatusTone = 'pass' | 'near' | 'over' | 'neutral';

const toneClass: Record<StatusTone, string> = {
  pass: 'text-moss border-moss/40 bg-moss/10 dark:text-[#7fbf8e] dark:border-[#7fbf8e]/40',
  near: 'text-[#8a5c0c] border-amber/50 bg-amber/10 dark:text-[#e0aa4c] dark:border-[#e0aa4c]/40',
  over: 'text-brick border-brick/40 bg-brick/10 dark:text-[#e07a6a] dark:border-[#e07a6a]/40',
  neutral: 'text-ink/70 border-grid-major bg-grid-minor/30 dark:text-paper/70 dark:border-night-line',
};

function ToneShape({ tone }: { tone: StatusTone }) {
  // filled circle = pass, triangle = near, cross = over, hollow circle = not known
  switch (tone) {
    case 'pass':
      return <circle cx="5" cy="5" r="3.5" fill="currentColor" />;
    case 'near':
      return <path d="M5 1.2L9 8.6H1Z" fill="currentColor" />;
    case 'over':
      return <path d="M1.8 1.8L8.2 8.2M8.2 1.8L1.8 8.2" stroke="currentColor" strokeWidth="1.8" />;
    case 'neutral':
      return <circle cx="5" cy="5" r="3.2" fill="none" stroke="currentColor" strokeWidth="1.3" />;
  }
}

export function StatusWord({ tone, children }: { tone: StatusTone; children: ReactNode }) {
  return (
    <span
      data-tone={tone}
      className={`inline-flex items-center gap-1.5 rounded-full border px-2 py-0.5 text-sm font-medium ${toneClass[tone]}`}
    >
      <svg viewBox="0 0 10 10" width="10" height="10" aria-hidden="true" focusable="false">
        <ToneShape tone={tone} />
      </svg>
      {children}
    </span>
  );
}
