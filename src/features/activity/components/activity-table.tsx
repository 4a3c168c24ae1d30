import { Link } from 'react-router-dom';
import type { ActivityItem } from '../../../../shared/schemas/activity';

function when(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

/** The "which" column: the pack, and the version or curve the row names, as links where they still exist. */
function Which({ item }: { item: ActivityItem }) {
  const parts: { to?: string; text: string }[] = [];
  if (item.pack) parts.push({ to: item.links.pack, text: item.pack.slug });
  if (item.subject.kind === 'version' && item.subject.label.startsWith('v')) parts.push({ to: item.links.version, text: item.subject.label });
  else if (item.subject.kind === 'channel') parts.push({ to: item.links.version, text: `${item.subject.label} → v${String(item.data.to ?? '?')}` });
  else if (item.subject.kind === 'curve') parts.push({ to: item.links.curve, text: item.subject.label });
  else if (item.subject.kind === 'profile') parts.push({ to: item.links.profiles, text: item.subject.label });
  return (
    <span className="font-mono">
      {parts.map((p, i) => (
        <span key={i}>
          {i ? ' / ' : ''}
          {p.to ? <Link to={p.to} className="underline underline-offset-2">{p.text}</Link> : p.text}
        </span>
      ))}
    </span>
  );
}

/** Who did what to which pack, version, curve, profile or channel: one row per event, newest first. */
export function ActivityTable({ items }: { items: ActivityItem[] }) {
  return (
    <table aria-label="Team activity" className="w-full text-left text-sm">
      <thead>
        <tr className="border-b border-grid-major dark:border-night-line">
          <th scope="col" className="py-2 pr-3">When</th>
          <th scope="col" className="py-2 pr-3">Who</th>
          <th scope="col" className="py-2 pr-3">What</th>
          <th scope="col" className="py-2">Which</th>
        </tr>
      </thead>
      <tbody>
        {items.map((i) => (
          <tr key={i.id} className="border-b border-grid-minor align-top dark:border-night-line">
            <td className="py-2 pr-3 whitespace-nowrap"><time dateTime={i.at} className="font-mono text-xs">{when(i.at)}</time></td>
            <td className="py-2 pr-3">{i.actor?.name ?? 'Tangentry'}</td>
            <td className="py-2 pr-3">{i.words}</td>
            <td className="py-2"><Which item={i} /></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
