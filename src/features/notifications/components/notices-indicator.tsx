import { useEffect, useId, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import type { NoticeDto } from '../../../../shared/schemas/notifications';
import { useMarkRead, useNotices } from '../api/notices';
import { NoticeList } from './notice-list';

/**
 * "Notices" in the top bar: a text button with the unread count; opening it shows the newest notices and
 * marks those shown as read. `onFollow` makes the notice's team current before its link opens.
 */
export function NoticesIndicator({ onFollow }: { onFollow: (n: NoticeDto) => void }) {
  const q = useNotices(true);
  const mark = useMarkRead();
  const [open, setOpen] = useState(false);
  const panelId = useId();
  const box = useRef<HTMLDivElement>(null);
  const unread = q.data?.unread ?? 0;
  const shown = (q.data?.notices ?? []).slice(0, 8);

  useEffect(() => {
    if (!open) return;
    const ids = shown.filter((n) => !n.readAt).map((n) => n.id);
    if (ids.length) mark.mutate({ ids });
    const away = (e: MouseEvent) => { if (box.current && !box.current.contains(e.target as Node)) setOpen(false); };
    const esc = (e: KeyboardEvent) => { if (e.key === 'Escape') setOpen(false); };
    document.addEventListener('mousedown', away);
    document.addEventListener('keydown', esc);
    return () => { document.removeEventListener('mousedown', away); document.removeEventListener('keydown', esc); };
    // mark only when the panel opens, not on every refetch while it is open
  }, [open]);

  return (
    <div ref={box} className="relative">
      <button type="button" aria-expanded={open} aria-controls={panelId} onClick={() => setOpen((o) => !o)}
        className="flex items-center gap-1.5 rounded-sm border border-transparent px-2 py-1 text-sm font-medium hover:border-ink/30 dark:hover:border-paper/30">
        Notices
        <span aria-label={`${unread} unread`} className={`min-w-5 rounded-sm px-1 text-center font-mono text-xs ${unread ? 'bg-vermilion text-paper' : 'border border-ink/30 text-ink/70 dark:border-paper/30 dark:text-paper/70'}`}>{unread}</span>
      </button>
      {open ? (
        <div id={panelId} role="region" aria-label="Your notices" className="absolute right-0 z-20 mt-2 w-80 rounded-md border border-grid-major bg-card p-3 shadow-md dark:border-night-line dark:bg-night-card">
          {q.isError ? <p role="alert" className="text-sm">Could not load your notices: {q.error.message}</p>
            : <NoticeList notices={shown} onFollow={(n) => { onFollow(n); setOpen(false); }} />}
          <Link to="/notices" onClick={() => setOpen(false)} className="mt-2 block text-sm underline underline-offset-2">All notices</Link>
        </div>
      ) : null}
    </div>
  );
}
