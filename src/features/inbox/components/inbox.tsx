import { Link } from 'react-router-dom';
import type { InboxItem } from '../../../../shared/schemas/inbox';
import { useInbox } from '../api/get-inbox';

/** A version's state in plain words (never colour alone). */
const STATE_WORDS: Record<string, string> = { proposed: 'waiting for review', 'changes-requested': 'changes requested', approved: 'approved' };

function when(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

interface Props {
  /** Whether the person's role reviews versions in at least one team (shows the reviews list). */
  canReview: boolean;
  /** Makes `teamId` the current team before following a link (version pages are per current team). */
  onOpenTeam: (teamId: string) => void;
}

function Row({ item, text, onOpenTeam }: { item: InboxItem; text: string; onOpenTeam: (teamId: string) => void }) {
  return (
    <li className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 border-b border-grid-minor py-2 last:border-b-0 dark:border-night-line">
      <span>
        <Link to={item.path} onClick={() => onOpenTeam(item.team.id)} className="font-medium underline underline-offset-2">
          {item.pack.name} v{item.version}
        </Link>{' '}
        <span className="text-ink/70 dark:text-paper/70">in {item.team.name}: {text}</span>
      </span>
      <time dateTime={item.at} className="font-mono text-xs text-ink/60 dark:text-paper/60">{when(item.at)}</time>
    </li>
  );
}

function Section({ id, title, empty, items, more, text, onOpenTeam }: { id: string; title: string; empty: string; items: InboxItem[]; more: boolean; text: (i: InboxItem) => string; onOpenTeam: (teamId: string) => void }) {
  return (
    <section aria-labelledby={id} className="rounded-md border border-grid-major/70 bg-card/80 p-4 dark:border-night-line dark:bg-night-card/80">
      <h2 id={id} className="text-lg font-semibold">{title}</h2>
      {items.length === 0 ? (
        <p className="mt-2 text-sm text-ink/65 dark:text-paper/65">{empty}</p>
      ) : (
        <ul className="mt-2 text-sm">
          {items.map((i) => <Row key={`${i.team.id}/${i.pack.slug}/${i.version}/${i.channel ?? ''}/${i.at}`} item={i} text={text(i)} onOpenTeam={onOpenTeam} />)}
        </ul>
      )}
      {more && <p className="mt-2 text-xs text-ink/65 dark:text-paper/65">Showing the {items.length} newest; older ones are on each pack's versions list.</p>}
    </section>
  );
}

/** What waits for the signed-in person: reviews to do, their proposals and their state, recent releases. */
export function Inbox({ canReview, onOpenTeam }: Props) {
  const inbox = useInbox(true);
  if (inbox.isPending) return <p role="status" className="text-sm">Loading what waits for you…</p>;
  if (inbox.isError) return <p role="alert" className="text-sm">Could not load what waits for you: {inbox.error.message}</p>;
  const { reviewsToDo, myProposals, recentReleases, more } = inbox.data;
  return (
    <div className="grid gap-6">
      {canReview && (
        <Section
          id="inbox-reviews" title="Reviews to do" empty="No proposed versions wait for your review."
          items={reviewsToDo} more={more?.reviewsToDo ?? false} text={(i) => `proposed by ${i.by ?? 'a removed account'}`} onOpenTeam={onOpenTeam}
        />
      )}
      <Section
        id="inbox-proposals" title="Your proposals" empty="You have not proposed a version yet."
        items={myProposals} more={more?.myProposals ?? false} text={(i) => (STATE_WORDS[i.state] ?? i.state) + (i.by ? ` (by ${i.by})` : '')} onOpenTeam={onOpenTeam}
      />
      <Section
        id="inbox-releases" title="Recent releases" empty="No channel has moved in your teams yet."
        items={recentReleases} more={more?.recentReleases ?? false} text={(i) => `released to ${i.channel ?? 'a channel'} by ${i.by ?? 'a removed account'}`} onOpenTeam={onOpenTeam}
      />
    </div>
  );
}
