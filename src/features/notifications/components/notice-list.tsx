import { Link } from 'react-router-dom';
import type { NoticeDto } from '../../../../shared/schemas/notifications';

function when(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

/** Notices, newest first; unread ones carry the word "new" (never colour alone). Following one opens its team. */
export function NoticeList({ notices, onFollow }: { notices: NoticeDto[]; onFollow: (n: NoticeDto) => void }) {
  if (!notices.length) return <p className="text-sm">Nothing new for you.</p>;
  return (
    <ul aria-label="Notices" className="text-sm">
      {notices.map((n) => (
        <li key={n.id} className="border-b border-grid-minor py-2 last:border-b-0 dark:border-night-line">
          <Link to={n.link} onClick={() => onFollow(n)} className="block rounded-sm hover:bg-grid-minor/40 dark:hover:bg-night-line/40">
            {n.readAt ? null : <span className="mr-2 rounded-sm border border-vermilion px-1 font-mono text-[0.65rem] uppercase text-vermilion">new</span>}
            <span className={n.readAt ? '' : 'font-medium'}>{n.text}</span>
            <span className="mt-0.5 block text-xs text-ink/60 dark:text-paper/60">{n.team.name} · <time dateTime={n.createdAt}>{when(n.createdAt)}</time></span>
          </Link>
        </li>
      ))}
    </ul>
  );
}
