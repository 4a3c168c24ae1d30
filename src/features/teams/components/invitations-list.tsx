import { ROLE_LABEL } from '../../../../shared/schemas/roles';
import { secondaryButton } from '../../../components/form-controls';
import { useInvitations } from '../api/list-invitations';
import { useWithdrawInvitation } from '../api/withdraw-invitation';

export function InvitationsList({ teamId }: { teamId: string }) {
  const list = useInvitations(teamId);
  const withdraw = useWithdrawInvitation(teamId);
  if (!list.data?.length) return <p className="text-sm text-ink/65 dark:text-paper/65">No open invitations.</p>;
  return (
    <ul className="divide-y divide-grid-minor text-sm dark:divide-night-line">
      {list.data.map((i) => (
        <li key={i.id} className="flex items-center justify-between gap-3 py-2">
          <span>
            <span className="font-mono text-xs">{i.email}</span> · {ROLE_LABEL[i.role]} · until{' '}
            <time className="font-mono text-xs" dateTime={i.expiresAt}>{i.expiresAt.slice(0, 10)}</time>
          </span>
          <button type="button" className={secondaryButton} onClick={() => withdraw.mutate(i.id)}>
            Withdraw
          </button>
        </li>
      ))}
    </ul>
  );
}
