import { useState } from 'react';
import { ROLES, ROLE_LABEL, type Role } from '../../../../shared/schemas/roles';
import { formMessage } from '../../../lib/form-errors';
import { FormAlert, dangerButton, secondaryButton } from '../../../components/form-controls';
import { useMembers } from '../api/list-members';
import { useChangeRole } from '../api/change-role';
import { useRemoveMember } from '../api/remove-member';

/** Members of a team; admins change roles and remove people (with a confirmation step). */
export function MembersTable({ teamId, canManage, myUserId }: { teamId: string; canManage: boolean; myUserId: string }) {
  const members = useMembers(teamId);
  const changeRole = useChangeRole(teamId);
  const remove = useRemoveMember(teamId);
  const [confirming, setConfirming] = useState<string | null>(null);
  const error = changeRole.error ?? remove.error;

  if (members.isPending) return <p className="text-sm">Loading members…</p>;
  if (members.isError) return <FormAlert message={formMessage(members.error)} />;
  return (
    <div>
      <FormAlert message={error ? formMessage(error) : null} />
      <table className="mt-2 w-full text-left text-sm">
        <thead className="border-b border-grid-major text-xs uppercase tracking-wide text-ink/60 dark:border-night-line dark:text-paper/60">
          <tr>
            <th className="py-2 pr-3 font-medium">Name</th>
            <th className="py-2 pr-3 font-medium">E-mail</th>
            <th className="py-2 pr-3 font-medium">Role</th>
            {canManage ? <th className="py-2 font-medium"><span className="sr-only">Actions</span></th> : null}
          </tr>
        </thead>
        <tbody className="divide-y divide-grid-minor dark:divide-night-line">
          {members.data.map((m) => (
            <tr key={m.userId} data-testid={`member-${m.email}`}>
              <td className="py-2 pr-3 font-medium">
                {m.name}
                {m.userId === myUserId ? <span className="ml-2 text-xs text-ink/60 dark:text-paper/60">(you)</span> : null}
              </td>
              <td className="py-2 pr-3 font-mono text-xs">{m.email}</td>
              <td className="py-2 pr-3">
                {canManage ? (
                  <select
                    aria-label={`Role of ${m.name}`}
                    value={m.role}
                    disabled={changeRole.isPending}
                    onChange={(e) => changeRole.mutate({ userId: m.userId, role: e.target.value as Role })}
                    className="rounded border border-grid-major bg-paper px-2 py-1 dark:border-night-line dark:bg-night"
                  >
                    {ROLES.map((r) => (
                      <option key={r} value={r}>
                        {ROLE_LABEL[r]}
                      </option>
                    ))}
                  </select>
                ) : (
                  ROLE_LABEL[m.role]
                )}
              </td>
              {canManage ? (
                <td className="py-2 text-right">
                  {confirming === m.userId ? (
                    <span className="inline-flex items-center gap-2">
                      <span className="text-xs">Remove {m.name} from the team?</span>
                      <button type="button" className={dangerButton} onClick={() => remove.mutate(m.userId, { onSettled: () => setConfirming(null) })}>
                        Yes, remove
                      </button>
                      <button type="button" className={secondaryButton} onClick={() => setConfirming(null)}>
                        Keep
                      </button>
                    </span>
                  ) : (
                    <button type="button" className={secondaryButton} onClick={() => setConfirming(m.userId)} aria-label={`Remove ${m.name}`}>
                      Remove
                    </button>
                  )}
                </td>
              ) : null}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
